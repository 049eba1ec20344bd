import type { DiscardAnswer } from '@shared/contract/quarantine.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { useQuarantineMutation } from './quarantine-mutation.ts';

/** `POST /api/v1/labs/:lab/quarantine/discard`: deletes quarantined rows for good (recorded in the audit log). */
export function discardRows(slug: string, ids: number[]): Promise<DiscardAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/quarantine/discard`, { method: 'POST', body: JSON.stringify({ ids }) });
}

/** Discards rows, then refreshes the quarantine lists. */
export function useDiscardRows(slug: string) {
  return useQuarantineMutation(slug, (ids: number[]) => discardRows(slug, ids));
}
