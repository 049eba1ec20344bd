import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { QuarantinePage } from '@shared/contract/quarantine.ts';
import { apiFetch } from '../../../lib/api-client.ts';

export interface QuarantineQuery {
  loggerId?: number;
  reason?: string;
  /** The channel name as received. */
  channel?: string;
  /** The `nextCursor` of the page before; absent for the first page. */
  cursor?: string;
  pageSize: number;
}

/** The query string of a quarantine request (also used by the CSV download), empty filters left out. */
export function quarantineSearch(query: Partial<QuarantineQuery>): string {
  const params = new URLSearchParams();
  if (query.loggerId) params.set('loggerId', String(query.loggerId));
  if (query.reason) params.set('reason', query.reason);
  if (query.channel) params.set('channel', query.channel);
  if (query.cursor) params.set('cursor', query.cursor);
  if (query.pageSize) params.set('pageSize', String(query.pageSize));
  const text = params.toString();
  return text ? `?${text}` : '';
}

const base = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/quarantine`;

/** `GET /api/v1/labs/:lab/quarantine?loggerId=&reason=&channel=&cursor=&pageSize=` (newest first). */
export function getQuarantine(slug: string, query: QuarantineQuery): Promise<QuarantinePage> {
  return apiFetch(`${base(slug)}${quarantineSearch(query)}`);
}

/** `GET /api/v1/labs/:lab/quarantine/export.csv` with the same filters: every matching row, as a download. */
export function quarantineExportUrl(slug: string, filters: { loggerId?: number; reason?: string; channel?: string }): string {
  return `${base(slug)}/export.csv${quarantineSearch({ loggerId: filters.loggerId, reason: filters.reason, channel: filters.channel })}`;
}

/** The prefix of every quarantine query of a lab, for refreshing them after a change. */
export const quarantineRootKey = (slug: string) => ['labs', slug, 'quarantine'] as const;

export const quarantineQueryOptions = (slug: string, query: QuarantineQuery) =>
  queryOptions({ queryKey: [...quarantineRootKey(slug), query], queryFn: () => getQuarantine(slug, query), placeholderData: keepPreviousData });

/** One page of quarantined rows; the previous page stays on screen while the next one loads. */
export function useQuarantine(slug: string, query: QuarantineQuery) {
  return useQuery(quarantineQueryOptions(slug, query));
}
