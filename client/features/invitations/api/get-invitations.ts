import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { PendingInvitationsAnswer } from '@shared/contract/invitations.ts';

/** `GET /api/v1/labs/:lab/invitations`: invitations not yet accepted, revoked or expired. */
export function getInvitations(slug: string): Promise<PendingInvitationsAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/invitations`);
}

export const invitationsQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'invitations'], queryFn: () => getInvitations(slug) });

/** The lab's pending invitations (admins only). */
export function useInvitations(slug: string) {
  return useQuery(invitationsQueryOptions(slug));
}
