import type { Lab } from '../../db/labs.repo.ts';
import type { Member } from '../../db/memberships.repo.ts';
import type { Member as MemberAnswer } from '../../contract/members.ts';
import type { Invitation } from '../../db/invitations.repo.ts';
import type { AuditEntry } from '../../db/audit.repo.ts';
import type { CreatedLab as CreatedLabAnswer, LabDetail } from '../../contract/labs.ts';
import type { PendingInvitation } from '../../contract/invitations.ts';
import type { AuditEntry as AuditEntryAnswer } from '../../contract/audit.ts';
import { auditSentence } from '../../contract/words/audit.ts';
import type { CreatedLab } from '../../services/labs.service.ts';
import { ROLE_PERMISSIONS, type Role } from '../../policies/permissions.ts';

/** A lab as seen by one of its members, with what their role allows (the client hides the rest). */
export function presentLabForMember(lab: Lab, role: Role): LabDetail {
  return {
    lab: { slug: lab.slug, name: lab.name, description: lab.description, createdAt: lab.createdAt.toISOString() },
    role,
    permissions: [...ROLE_PERMISSIONS[role]],
  };
}

/** The answer to `POST /api/v1/labs`: the new lab with the creator's role, and the address asked for. */
export function presentCreatedLab({ lab, requestedSlug }: CreatedLab): CreatedLabAnswer {
  return { lab: { slug: lab.slug, name: lab.name, role: 'admin' }, requestedSlug };
}

/** One member of a lab with their role and when they joined. */
export function presentMember(m: Member): MemberAnswer {
  return { userId: m.userId, name: m.name, email: m.email, role: m.role, joinedAt: m.joinedAt.toISOString() };
}

/** Pending invitation for admins; the secret never leaves the server after the e-mail. */
export function presentInvitation(i: Invitation): PendingInvitation {
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

/** One entry of the audit log, its time in ISO 8601, with the sentence people read (the raw action and details kept). */
export function presentAuditEntry(e: AuditEntry): AuditEntryAnswer {
  return { id: e.id, at: e.at.toISOString(), actor: e.actor, action: e.action, sentence: auditSentence(e), summary: e.summary, details: e.details };
}
