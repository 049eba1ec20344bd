import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { membersQueryOptions } from './get-members.ts';

/** `DELETE /api/v1/labs/:lab/members/:userId`; 409 `last_admin` for the lab's only admin. */
export function removeMember(slug: string, userId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/members/${userId}`, { method: 'DELETE' });
}

/** Removes one member, then refreshes the member list. */
export function useRemoveMember(slug: string, userId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => removeMember(slug, userId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: membersQueryOptions(slug).queryKey }),
  });
}
