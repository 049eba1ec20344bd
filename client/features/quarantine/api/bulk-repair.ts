import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import type { BulkPreview, BulkRequest, BulkRun } from '@shared/contract/quarantine.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { quarantineRootKey } from './get-quarantine.ts';

const base = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/quarantine/bulk`;

/** `POST …/quarantine/bulk/preview`: what a repair would do; nothing changes. */
export function previewBulk(slug: string, request: BulkRequest): Promise<BulkPreview> {
  return apiFetch(`${base(slug)}/preview`, { method: 'POST', body: JSON.stringify(request) });
}

/** `POST …/quarantine/bulk/runs` (202): starts applying the repair in the background. */
export function startBulkRun(slug: string, request: BulkRequest): Promise<BulkRun> {
  return apiFetch(`${base(slug)}/runs`, { method: 'POST', body: JSON.stringify(request) });
}

/** `GET …/quarantine/bulk/runs/:runId`. */
export function getBulkRun(slug: string, runId: number): Promise<BulkRun> {
  return apiFetch(`${base(slug)}/runs/${runId}`);
}

/** Asks for a preview (a mutation: each request is a fresh question, never cached). */
export function useBulkPreview(slug: string) {
  return useMutation({ mutationFn: (request: BulkRequest) => previewBulk(slug, request) });
}

/** Starts a run. */
export function useStartBulkRun(slug: string) {
  return useMutation({ mutationFn: (request: BulkRequest) => startBulkRun(slug, request) });
}

/** How often the page asks a running repair how far it is. */
export const BULK_POLL_MS = 1000;

export const bulkRunQueryOptions = (slug: string, runId: number) =>
  queryOptions({
    queryKey: ['labs', slug, 'quarantine-bulk-run', runId],
    queryFn: () => getBulkRun(slug, runId),
    refetchInterval: (query) => (query.state.data?.state === 'running' ? BULK_POLL_MS : false),
  });

/**
 * A run, asked again every second while it works; once it has ended, the quarantine lists are
 * refreshed (the rows it repaired are gone from them).
 */
export function useBulkRun(slug: string, runId: number | null) {
  const queryClient = useQueryClient();
  const query = useQuery({ ...bulkRunQueryOptions(slug, runId ?? 0), enabled: runId !== null });
  const ended = query.data && query.data.state !== 'running';
  useEffect(() => {
    if (ended) void queryClient.invalidateQueries({ queryKey: quarantineRootKey(slug) });
  }, [ended, queryClient, slug]);
  return query;
}
