import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { LabOverviewAnswer } from '@shared/contract/overview.ts';

/** The overview is read again this often while the lab's home page is open. */
export const OVERVIEW_REFRESH_MS = 60_000;

/** `GET /api/v1/labs/:lab/overview`: what needs attention in the lab, as the member's role may see it. */
export function getOverview(slug: string): Promise<LabOverviewAnswer> {
  return apiFetch<LabOverviewAnswer>(`/api/v1/labs/${encodeURIComponent(slug)}/overview`);
}

export const overviewQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'overview'], queryFn: () => getOverview(slug) });

/** The lab's overview, refreshed every minute while the page is open. */
export function useOverview(slug: string) {
  return useQuery({ ...overviewQueryOptions(slug), refetchInterval: OVERVIEW_REFRESH_MS });
}
