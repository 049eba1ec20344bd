import type { Lab } from '../../db/labs.repo.ts';
import type { Member } from '../../db/memberships.repo.ts';
import type { Member as MemberAnswer } from '../../contract/members.ts';
import type { Invitation } from '../../db/invitations.repo.ts';
import type { AuditEntry } from '../../db/audit.repo.ts';
import { ROLE_PERMISSIONS, type Role } from '../../policies/permissions.ts';

/** A lab as seen by one of its members, with what their role allows (the client hides the rest). */
export function presentLabForMember(lab: Lab, role: Role) {
  return {
    lab: { slug: lab.slug, name: lab.name, createdAt: lab.createdAt.toISOString() },
    role,
    permissions: [...ROLE_PERMISSIONS[role]],
  };
}

export function presentMember(m: Member): MemberAnswer {
  return { userId: m.userId, name: m.name, email: m.email, role: m.role, joinedAt: m.joinedAt.toISOString() };
}

/** Pending invitation for admins; the secret never leaves the server after the e-mail. */
export function presentInvitation(i: Invitation) {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    invitedBy: i.invitedBy,
    createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
    lastSentAt: i.lastSentAt.toISOString(),
  };
}

export function presentAuditEntry(e: AuditEntry) {
  return { id: e.id, at: e.at.toISOString(), actor: e.actor, action: e.action, summary: e.summary, details: e.details };
}
