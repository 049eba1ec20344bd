import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { Role } from '../../../../server/policies/permissions.ts';

export interface PendingInvitation {
  id: number;
  email: string;
  role: Role;
  /** Null when the inviting account no longer exists. */
  invitedBy: { name: string; email: string } | null;
  createdAt: string;
  expiresAt: string;
  lastSentAt: string;
}

/** `GET /api/v1/labs/:lab/invitations`: invitations not yet accepted, revoked or expired. */
export function getInvitations(slug: string): Promise<{ invitations: PendingInvitation[] }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/invitations`);
}

export const invitationsQueryOptions = (slug: string) =>
  queryOptions({ queryKey: ['labs', slug, 'invitations'], queryFn: () => getInvitations(slug) });

/** The lab's pending invitations (admins only). */
export function useInvitations(slug: string) {
  return useQuery(invitationsQueryOptions(slug));
}
