import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { InvitationPreview } from '@shared/contract/invitations.ts';

/**
 * `GET /api/v1/invitations/:lab/:token`: what an invitation link offers. 404
 * `invitation_not_found`; 410 `invitation_expired` / `invitation_used` / `invitation_revoked`.
 */
export function getInvitationByToken(slug: string, token: string): Promise<InvitationPreview> {
  return apiFetch(`/api/v1/invitations/${encodeURIComponent(slug)}/${encodeURIComponent(token)}`);
}

export const invitationByTokenQueryOptions = (slug: string, token: string) =>
  queryOptions({
    queryKey: ['invitations', slug, token],
    queryFn: () => getInvitationByToken(slug, token),
    // A dead link stays dead: no retry.
    retry: false,
  });

/** The invitation behind a link, for the acceptance page. */
export function useInvitationByToken(slug: string, token: string) {
  return useQuery(invitationByTokenQueryOptions(slug, token));
}
