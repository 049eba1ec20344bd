import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { InvitationAnswer, InviteMemberInput } from '@shared/contract/invitations.ts';
import { invitationsQueryOptions } from './get-invitations.ts';

/**
 * `POST /api/v1/labs/:lab/invitations`: invites an address in a role and mails the link.
 * 409 `invitation_pending` or `already_member` when there is nothing new to send.
 */
export function createInvitation(slug: string, input: InviteMemberInput): Promise<InvitationAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/invitations`, { method: 'POST', body: JSON.stringify(input) });
}

/** Sends an invitation, then refreshes the pending list. */
export function useCreateInvitation(slug: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteMemberInput) => createInvitation(slug, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationsQueryOptions(slug).queryKey }),
  });
}
