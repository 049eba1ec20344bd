import { useMutation } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { AcceptedInvitation } from '@shared/contract/invitations.ts';

/**
 * `POST /api/v1/invitations/:lab/:token/accept`: joins the lab. 403
 * `invitation_wrong_account`; 410 for a dead link; 409 `already_member`.
 */
export function acceptInvitation(slug: string, token: string): Promise<AcceptedInvitation> {
  return apiFetch(`/api/v1/invitations/${encodeURIComponent(slug)}/${encodeURIComponent(token)}/accept`, { method: 'POST' });
}

/** Accepts the invitation behind a link; the caller refreshes the person's labs and opens the lab. */
export function useAcceptInvitation(slug: string, token: string) {
  return useMutation({ mutationFn: () => acceptInvitation(slug, token) });
}
