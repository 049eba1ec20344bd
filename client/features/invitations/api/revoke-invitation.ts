import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { invitationsQueryOptions } from './get-invitations.ts';

/** `DELETE /api/v1/labs/:lab/invitations/:id`: the link stops working at once. */
export function revokeInvitation(slug: string, id: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/invitations/${id}`, { method: 'DELETE' });
}

/** Revokes one invitation, then refreshes the pending list. */
export function useRevokeInvitation(slug: string, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => revokeInvitation(slug, id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions(slug).queryKey }),
  });
}
