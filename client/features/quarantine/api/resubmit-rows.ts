import type { ResubmitOutcome, ResubmitRow } from '@shared/contract/quarantine.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { useQuarantineMutation } from './quarantine-mutation.ts';

/**
 * `POST /api/v1/labs/:lab/quarantine/resubmit`: ingests the rows again by the same rules as
 * live readings; a row that fails again returns to quarantine (as a new row) with its new reason.
 */
export function resubmitRows(slug: string, rows: ResubmitRow[]): Promise<ResubmitOutcome> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/quarantine/resubmit`, { method: 'POST', body: JSON.stringify({ rows }) });
}

/** Re-submits rows, then refreshes the quarantine lists. */
export function useResubmitRows(slug: string) {
  return useQuarantineMutation(slug, (rows: ResubmitRow[]) => resubmitRows(slug, rows));
}
