import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { LabDetail, UpdateLabInput } from '@shared/contract/labs.ts';
import { labQueryOptions } from './get-lab.ts';

/** `PATCH /api/v1/labs/:lab` (admins): a new name and/or description; the address stays. */
export function updateLab(slug: string, input: UpdateLabInput): Promise<LabDetail> {
  return apiFetch<LabDetail>(`/api/v1/labs/${encodeURIComponent(slug)}`, { method: 'PATCH', body: JSON.stringify(input) });
}

/** Renames or describes the lab; the lab's own record and the lab lists (which show the name) are refreshed. */
export function useUpdateLab(slug: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateLabInput) => updateLab(slug, input),
    onSuccess: (detail) => {
      queryClient.setQueryData(labQueryOptions(slug).queryKey, detail);
      void queryClient.invalidateQueries({ queryKey: ['me'] });
    },
  });
}
