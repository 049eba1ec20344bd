import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { auditQuerySchema, type AuditPage, type AuditQuery } from '@shared/contract/audit.ts';

/**
 * `GET /api/v1/labs/:lab/audit`: one page of the lab's audit log, newest first. The query is
 * checked with the server's own `auditQuerySchema` before it is sent.
 */
export function getAuditLog(slug: string, query: Partial<AuditQuery>): Promise<AuditPage> {
  const parsed = auditQuerySchema.parse(query);
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(parsed)) {
    if (value !== undefined && value !== '') params.set(key, String(value));
  }
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/audit?${params}`);
}

export const auditLogQueryOptions = (slug: string, query: Partial<AuditQuery>) =>
  queryOptions({
    queryKey: ['labs', slug, 'audit', query],
    queryFn: () => getAuditLog(slug, query),
    // Keep the current page on screen while the next one loads.
    placeholderData: keepPreviousData,
  });

/** One page of the audit log for the given filters. */
export function useAuditLog(slug: string, query: Partial<AuditQuery>) {
  return useQuery(auditLogQueryOptions(slug, query));
}
