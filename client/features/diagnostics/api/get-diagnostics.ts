import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DiagnosticsAnswer, DiagnosticsParams } from '@shared/contract/diagnostics.ts';
import { apiFetch } from '../../../lib/api-client.ts';

const base = (slug: string, channelId: number) => `/api/v1/labs/${encodeURIComponent(slug)}/channels/${channelId}`;

/** The query string of a diagnostics request; parameters left out take the server's defaults. */
export function diagnosticsSearch(p: DiagnosticsParams): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(p)) if (v !== undefined && v !== '') q.set(k, String(v));
  return q.toString();
}

/** `GET …/channels/:channelId/diagnostics?…`; aborting `signal` drops the request, and the server then cancels the work. */
export function getDiagnostics(slug: string, channelId: number, params: DiagnosticsParams, signal?: AbortSignal): Promise<DiagnosticsAnswer> {
  return apiFetch(`${base(slug, channelId)}/diagnostics?${diagnosticsSearch(params)}`, { signal });
}

/** Links to the diagnostics as JSON (the answer itself) and as the server's CSV table. */
export function diagnosticsExportUrls(slug: string, channelId: number, params: DiagnosticsParams): { json: string; csv: string } {
  const search = diagnosticsSearch(params);
  return { json: `${base(slug, channelId)}/diagnostics?${search}`, csv: `${base(slug, channelId)}/diagnostics.csv?${search}` };
}

export const diagnosticsQueryOptions = (slug: string, channelId: number, params: DiagnosticsParams | null) =>
  queryOptions({
    queryKey: ['labs', slug, 'diagnostics', channelId, params],
    queryFn: ({ signal }) => getDiagnostics(slug, channelId, params!, signal),
    enabled: params !== null,
    staleTime: 5 * 60_000,
  });

/** The diagnostics for `params`, fetched only once `params` is set (the "Analyse" button). */
export function useDiagnostics(slug: string, channelId: number, params: DiagnosticsParams | null) {
  return useQuery(diagnosticsQueryOptions(slug, channelId, params));
}
