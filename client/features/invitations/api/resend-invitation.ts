import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { InvitationAnswer } from '@shared/contract/invitations.ts';
import { invitationsQueryOptions } from './get-invitations.ts';

/** `POST /api/v1/labs/:lab/invitations/:id/resend`: a new link and expiry; the old link stops working. */
export function resendInvitation(slug: string, id: number): Promise<InvitationAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/invitations/${id}/resend`, { method: 'POST' });
}

/** Sends one invitation again, then refreshes the pending list. */
export function useResendInvitation(slug: string, id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => resendInvitation(slug, id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions(slug).queryKey }),
  });
}
