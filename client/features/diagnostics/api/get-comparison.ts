import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { DiagnosticsParams, ReportChannel } from './get-diagnostics.ts';

/**
 * What the before/after comparison asks for: range a of this channel against range b of
 * `otherChannel` (of this channel when absent). Times are epoch ms; optional fields take the
 * server's defaults.
 */
export interface ComparisonParams {
  aFrom: number;
  aTo: number;
  bFrom: number;
  bTo: number;
  step?: number;
  agg?: DiagnosticsParams['agg'];
  otherChannel?: number;
  alpha?: number;
}

/** One range's mean and spread with its effective sample size n/τ. */
export interface RangeSummary {
  from: number;
  to: number;
  n: number;
  mean: number;
  sd: number;
  effectiveN: number;
  autocorrelationTime: number;
}

/** The comparison answer: difference of means with a dependence-aware interval and the naive Welch one beside it. */
export interface ComparisonAnswer {
  channel: ReportChannel;
  other: ReportChannel | null;
  a: RangeSummary;
  b: RangeSummary;
  /** mean(b) − mean(a), in the channel's unit. */
  difference: number;
  alpha: number;
  /** From effective sample sizes. */
  dependent: { standardError: number; df: number; interval: [number, number] };
  /** Naive, independence assumed. */
  welch: { standardError: number; df: number; interval: [number, number] };
  caution: string | null;
  sentence: string;
  method: { stepS: number; agg: string; statement: string; references: string[] };
}

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
