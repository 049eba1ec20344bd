import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

export type Role = 'admin' | 'technician' | 'scientist' | 'guest';

export interface Me {
  /** `timeZone`: the person's own IANA zone for alert mails, null when not set. */
  user: { id: number; email: string; name: string; timeZone: string | null };
  labs: Array<{ slug: string; name: string; role: Role }>;
}

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
