import { apiFetch } from '../../../lib/api-client.ts';
import { useQuarantineMutation } from './quarantine-mutation.ts';

/** A quarantined row sent again, as it was or as corrected. */
export interface ResubmitRow {
  id: number;
  channel: string;
  ts: string | number;
  value: string | number;
}

/** What became of re-submitted rows; `quarantined` names the rows (by their old id) that failed again, and why. */
export interface ResubmitOutcome {
  resubmitted: number;
  accepted: number;
  duplicates: number;
  quarantined: Array<{ id: number; code: string; reason: string }>;
}

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
