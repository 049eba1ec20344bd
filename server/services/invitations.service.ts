import { randomBytes } from 'node:crypto';
import { hashSecret } from './secret-format.ts';
import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { invitationsRepo, type Invitation } from '../db/invitations.repo.ts';
import { membershipsRepo } from '../db/memberships.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { labsRepo, type Lab } from '../db/labs.repo.ts';
import { crossLabRepo } from '../db/cross-lab.repo.ts';
import type { Mailer } from '../integrations/mail/create-mailer.ts';
import { AppError, NotFoundError, ServiceUnavailableError } from '../errors.ts';
import { ConflictError, GoneError, fieldConflict } from './service-errors.ts';
import { invitationMail } from './mail/invitation-mail.ts';
import type { Actor, LabContext } from './lab-context.ts';
import type { PlanLimitGuard } from './billing/plan-limits.ts';
import type { InviteMemberInput } from '../contract/invitations.ts';
import { MEMBER_LABELS, MEMBER_REASONS } from '../contract/words/members.ts';

export const INVITATION_LIFETIME_MS = 7 * 24 * 3600 * 1000;

/** SHA-256 of an invitation secret; only this is stored. */
export const hashInvitationToken = hashSecret;

export interface InvitationPreview {
  lab: Pick<Lab, 'slug' | 'name'>;
  invitation: Invitation;
  matchesSignedInUser: boolean;
}

/**
 * Invitations by e-mail: an admin invites an address with a role; the mail carries a
 * single-use link (`/join/<lab>/<secret>`) that expires; accepting requires signing in with
 * that verified address. The mail is sent before the transaction commits, so a mail server
 * that is down leaves nothing half-made.
 */
export function createInvitationsService(deps: { db: Db; mailer: Mailer; publicUrl: string; now?: () => Date; planLimits?: PlanLimitGuard }) {
  const now = deps.now ?? (() => new Date());
  const linkFor = (slug: string, token: string) => `${deps.publicUrl}/join/${slug}/${token}`;

  async function sendOrFail(mail: Parameters<Mailer['send']>[0]): Promise<void> {
    try {
      await deps.mailer.send(mail);
    } catch {
      throw new ServiceUnavailableError('The invitation e-mail could not be sent (the mail server did not answer); nothing was saved. Try again shortly.', 30);
    }
  }

  /** Finds an invitation by lab slug and secret; unknown lab or secret is the same 404. */
  async function resolve(slug: string, token: string, trx: Db, lock: boolean) {
    const tokenHash = /^[A-Za-z0-9_-]{20,100}$/.test(token) ? hashInvitationToken(token) : null;
    const found = await crossLabRepo(trx).invitationByToken(slug, tokenHash, { lock });
    if (!found) throw new AppError(404, 'invitation_not_found', 'This invitation link is not valid. Ask the lab admin for a new one.');
    return found;
  }

  function assertUsable(invitation: Invitation): void {
    if (invitation.acceptedAt) throw new GoneError('invitation_used', 'This invitation has already been used.');
    if (invitation.revokedAt) throw new GoneError('invitation_revoked', 'This invitation was withdrawn by the lab admin.');
    if (invitation.expiresAt.getTime() <= now().getTime()) {
      throw new GoneError('invitation_expired', 'This invitation has expired. Ask the lab admin to send it again.');
    }
  }

  async function createInvitation(lab: LabContext, actor: Actor | null, input: InviteMemberInput, deliver: 'mail' | 'return-link') {
    return deps.db.transaction(async (trx) => {
      await labsRepo(trx).lock(lab.id);
      const scope = inLab(trx, lab.id);
      const invitations = invitationsRepo(scope);
      const members = await membershipsRepo(scope).list();
      if (members.some((m) => m.email === input.email)) {
        throw fieldConflict('already_member', 'email', MEMBER_LABELS.email, MEMBER_REASONS.alreadyMember);
      }
      if ((await invitations.pendingFor(input.email, now())).length > 0) {
        throw fieldConflict('invitation_pending', 'email', MEMBER_LABELS.email, MEMBER_REASONS.alreadyPending);
      }
      await deps.planLimits?.assertRoomFor(trx, lab.id, 'members');
      const token = randomBytes(32).toString('base64url');
      const expiresAt = new Date(now().getTime() + INVITATION_LIFETIME_MS);
      const id = await invitations.insert({
        email: input.email,
        role: input.role,
        tokenHash: hashInvitationToken(token),
        invitedBy: actor?.id ?? null,
        expiresAt,
      });
      const inviter = actor?.displayName ?? 'A Lagbook operator';
      await auditRepo(scope).record({
        actorUserId: actor?.id ?? null,
        action: 'invitation.created',
        targetType: 'invitation',
        targetId: id,
        summary: `${inviter} invited ${input.email} as ${input.role}`,
        details: { email: input.email, role: input.role },
      });
      const link = linkFor(lab.slug, token);
      if (deliver === 'mail') {
        await sendOrFail(invitationMail({ to: input.email, labName: lab.name, role: input.role, inviterName: inviter, link, expiresAt }));
      }
      return { invitation: (await invitations.findById(id))!, link };
    });
  }

  return {
    listPending(lab: LabContext): Promise<Invitation[]> {
      return invitationsRepo(inLab(deps.db, lab.id)).listPending(now());
    },

    async invite(lab: LabContext, actor: Actor, input: InviteMemberInput): Promise<Invitation> {
      return (await createInvitation(lab, actor, input, 'mail')).invitation;
    },

    /**
     * For operators (the ops CLI): invites without a signed-in admin and returns the link
     * instead of mailing it, for the operator to pass on.
     */
    inviteAsOperator(lab: LabContext, input: InviteMemberInput): Promise<{ invitation: Invitation; link: string }> {
      return createInvitation(lab, null, input, 'return-link');
    },

    /** Sends a fresh link with a new expiry; the old link stops working. */
    async resend(lab: LabContext, actor: Actor, id: number): Promise<Invitation> {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const invitations = invitationsRepo(scope);
        const invitation = await invitations.findById(id, { lock: true });
        if (!invitation || invitation.acceptedAt || invitation.revokedAt) throw new NotFoundError('No such pending invitation.');
        const token = randomBytes(32).toString('base64url');
        const expiresAt = new Date(now().getTime() + INVITATION_LIFETIME_MS);
        await invitations.renew(id, hashInvitationToken(token), expiresAt, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'invitation.resent',
          targetType: 'invitation',
          targetId: id,
          summary: `${actor.displayName} sent the invitation to ${invitation.email} again`,
          details: { email: invitation.email },
        });
        await sendOrFail(
          invitationMail({
            to: invitation.email,
            labName: lab.name,
            role: invitation.role,
            inviterName: actor.displayName,
            link: linkFor(lab.slug, token),
            expiresAt,
          }),
        );
        return (await invitations.findById(id))!;
      });
    },

    async revoke(lab: LabContext, actor: Actor, id: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const invitations = invitationsRepo(scope);
        const invitation = await invitations.findById(id, { lock: true });
        if (!invitation || invitation.acceptedAt || invitation.revokedAt) throw new NotFoundError('No such pending invitation.');
        await invitations.markRevoked(id, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'invitation.revoked',
          targetType: 'invitation',
          targetId: id,
          summary: `${actor.displayName} withdrew the invitation to ${invitation.email}`,
          details: { email: invitation.email },
        });
      });
    },

    /** What the link offers, for the acceptance page. */
    async preview(slug: string, token: string, actor: Actor): Promise<InvitationPreview> {
      const { lab, invitation } = await resolve(slug, token, deps.db, false);
      assertUsable(invitation);
      return { lab: { slug: lab.slug, name: lab.name }, invitation, matchesSignedInUser: actor.emailVerified && actor.email === invitation.email };
    },

    /** Joins the lab with the invited role; single use, only for the invited, verified address. */
    async accept(slug: string, token: string, actor: Actor): Promise<{ lab: Lab; role: Invitation['role'] }> {
      return deps.db.transaction(async (trx) => {
        const { lab, invitation } = await resolve(slug, token, trx as unknown as Db, true);
        assertUsable(invitation);
        if (!actor.emailVerified || actor.email !== invitation.email) {
          throw new AppError(403, 'invitation_wrong_account', `This invitation is for ${invitation.email}. Sign in with that address to accept it.`);
        }
        const scope = inLab(trx, lab.id);
        if (await membershipsRepo(scope).roleOf(actor.id)) throw new ConflictError('already_member', 'You are already a member of this lab.');
        await membershipsRepo(scope).add(actor.id, invitation.role);
        await invitationsRepo(scope).markAccepted(invitation.id, actor.id, now());
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'invitation.accepted',
          targetType: 'invitation',
          targetId: invitation.id,
          summary: `${actor.displayName} joined the lab as ${invitation.role}`,
          details: { email: invitation.email, role: invitation.role },
        });
        return { lab, role: invitation.role };
      });
    },
  };
}

export type InvitationsService = ReturnType<typeof createInvitationsService>;
