import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LoggersAnswer } from '@shared/contract/loggers.ts';
import { apiFetch } from '../../../lib/api-client.ts';

const base = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/loggers`;

/** `GET /api/v1/labs/:lab/loggers[?includeRetired=true]`. */
export function getLoggers(slug: string, includeRetired: boolean): Promise<LoggersAnswer> {
  return apiFetch(`${base(slug)}${includeRetired ? '?includeRetired=true' : ''}`);
}

/** The prefix of every logger query of a lab (lists and single loggers), for refreshing them together. */
export const loggersRootKey = (slug: string) => ['labs', slug, 'loggers'] as const;

export const loggersQueryOptions = (slug: string, includeRetired = false) =>
  queryOptions({ queryKey: [...loggersRootKey(slug), { includeRetired }], queryFn: () => getLoggers(slug, includeRetired) });

/** The lab's loggers, retired ones only on request. */
export function useLoggers(slug: string, includeRetired = false) {
  return useQuery(loggersQueryOptions(slug, includeRetired));
}
