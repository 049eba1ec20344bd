import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { DeleteLabInput, LabDeletionStarted } from '@shared/contract/labs.ts';
import { labQueryOptions } from './get-lab.ts';

/**
 * `POST /api/v1/labs/:lab/deletion` (admins): deletes the lab after its name was typed again;
 * 400 for a name that does not match, 409 `unpaid_invoice` while an invoice is unpaid.
 */
export function deleteLab(slug: string, input: DeleteLabInput): Promise<LabDeletionStarted> {
  return apiFetch<LabDeletionStarted>(`/api/v1/labs/${encodeURIComponent(slug)}/deletion`, { method: 'POST', body: JSON.stringify(input) });
}

/** Deletes the lab; the caller leaves the lab's pages, then the lab lists are read again (without it). */
export function useDeleteLab(slug: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: DeleteLabInput) => deleteLab(slug, input),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: labQueryOptions(slug).queryKey, exact: true });
      void queryClient.invalidateQueries({ queryKey: ['me'] });
    },
  });
}
