import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch, ApiError } from '../../../lib/api-client.ts';
import type { LabDetail } from '@shared/contract/labs.ts';

/** `GET /api/v1/labs/:lab`: the lab, the signed-in member's role and what that role may do. */
export function getLab(slug: string): Promise<LabDetail> {
  return apiFetch<LabDetail>(`/api/v1/labs/${encodeURIComponent(slug)}`);
}

export const labQueryOptions = (slug: string) =>
  queryOptions({
    queryKey: ['labs', slug],
    queryFn: () => getLab(slug),
    // A 4xx (no such lab, no access, signed out) will not change by asking again.
    retry: (failures, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failures < 1,
  });

/** One lab as the signed-in member sees it; a 404 ApiError means "no such lab or no access". */
export function useLab(slug: string) {
  return useQuery(labQueryOptions(slug));
}
