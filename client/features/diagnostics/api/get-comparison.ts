import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { ComparisonAnswer, ComparisonParams } from '@shared/contract/diagnostics.ts';

const base = (slug: string, channelId: number) => `/api/v1/labs/${encodeURIComponent(slug)}/channels/${channelId}`;

/** The query string of a comparison request, in a fixed order; parameters left out take the server's defaults. */
export function comparisonSearch(p: ComparisonParams): string {
  const q = new URLSearchParams();
  for (const k of ['aFrom', 'aTo', 'bFrom', 'bTo', 'step', 'agg', 'otherChannel', 'alpha'] as const) if (p[k] !== undefined) q.set(k, String(p[k]));
  return q.toString();
}

/** `GET …/channels/:channelId/comparison?…`; aborting `signal` drops the request. */
export function getComparison(slug: string, channelId: number, params: ComparisonParams, signal?: AbortSignal): Promise<ComparisonAnswer> {
  return apiFetch(`${base(slug, channelId)}/comparison?${comparisonSearch(params)}`, { signal });
}

export const comparisonQueryOptions = (slug: string, channelId: number, params: ComparisonParams | null) =>
  queryOptions({
    queryKey: ['labs', slug, 'comparison', channelId, params],
    queryFn: ({ signal }) => getComparison(slug, channelId, params!, signal),
    enabled: params !== null,
    staleTime: 5 * 60_000,
  });

/** The comparison for `params`, fetched only once `params` is set (the "Compare" button). */
export function useComparison(slug: string, channelId: number, params: ComparisonParams | null) {
  return useQuery(comparisonQueryOptions(slug, channelId, params));
}
