import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Me } from '@shared/contract/me.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** `GET /api/v1/me`. */
export function getMe(): Promise<Me> {
  return apiFetch<Me>('/api/v1/me');
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: getMe,
    staleTime: 60_000,
    retry: false,
  });

/** The signed-in person; errors with a 401 ApiError when nobody is signed in. */
export function useMe() {
  return useQuery(meQueryOptions());
}
