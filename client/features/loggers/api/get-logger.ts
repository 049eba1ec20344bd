import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { loggersRootKey, type LoggerSummary } from './get-loggers.ts';

export interface Channel {
  id: number;
  loggerId: number;
  key: string;
  label: string;
  unit: string | null;
  quantity: string | null;
  validMin: number | null;
  validMax: number | null;
  expectedIntervalS: number | null;
  seasonalPeriodHint: number | null;
  retiredAt: string | null;
}

/** Metadata of an ingest key; the key itself is never sent again after it was issued. */
export interface IngestKeyInfo {
  id: number;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** One logger with its channels, and its keys for roles that manage keys. */
export type LoggerDetail = Omit<LoggerSummary, 'channelCount'> & { channels: Channel[]; keys?: IngestKeyInfo[] };

/** `GET /api/v1/labs/:lab/loggers/:loggerId`. */
export function getLogger(slug: string, loggerId: number): Promise<{ logger: LoggerDetail }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}`);
}

export const loggerQueryOptions = (slug: string, loggerId: number) =>
  queryOptions({ queryKey: [...loggersRootKey(slug), 'one', loggerId], queryFn: () => getLogger(slug, loggerId) });

/** One logger of the lab; a 404 ApiError when there is no such logger in this lab. */
export function useLogger(slug: string, loggerId: number) {
  return useQuery(loggerQueryOptions(slug, loggerId));
}
