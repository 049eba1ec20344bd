import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

/** A logger as the lab's list shows it. Instants are ISO 8601 strings; `null` means never / not retired. */
export interface LoggerSummary {
  id: number;
  name: string;
  serial: string | null;
  site: string | null;
  timezone: string;
  expectedIntervalS: number;
  createdAt: string;
  retiredAt: string | null;
  lastSeenAt: string | null;
  channelCount: number;
}

const base = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/loggers`;

/** `GET /api/v1/labs/:lab/loggers[?includeRetired=true]`. */
export function getLoggers(slug: string, includeRetired: boolean): Promise<{ loggers: LoggerSummary[] }> {
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
