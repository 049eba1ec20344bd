import {
  invitationLinkParams,
  invitationParams,
  inviteMemberSchema,
  type AcceptedInvitation,
  type InvitationAnswer,
  type InvitationPreview,
  type PendingInvitationsAnswer,
} from '../../contract/invitations.ts';
import { presentInvitation } from '../presenters/labs.presenter.ts';
import type { InvitationsService } from '../../services/invitations.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';
import { DEFAULT_RATE_LIMITS, perPersonLimit, type RateLimit } from '../middleware/rate-limits.ts';

/** Sending mail: the per-admin limit, and the mail server that may be down. */
const MAIL_ERRORS = {
  429: '`rate_limited`: this admin sent too many invitation mails in a short time (30 an hour by default). Retry-After gives the seconds to wait.',
  503: '`service_unavailable`: the database is unreachable, or the mail server did not answer, so the invitation e-mail could not be sent; nothing was saved. Retry-After says when to try again.',
};

/** A link that is no longer usable. */
const GONE = '`invitation_expired`, `invitation_used` or `invitation_revoked`: the link was valid but can no longer be used.';
const LINK_NOT_FOUND = '`invitation_not_found`: no such lab or no such invitation secret (one answer for both).';

/**
 * Admins list, create, resend and revoke a lab's pending invitations. Creating and resending
 * send mail, so they share one per-admin rate limit (`sendLimit`).
 */
export function invitationRoutes(deps: { invitations: InvitationsService; sendLimit?: RateLimit }): Route[] {
  const limit = perPersonLimit(deps.sendLimit ?? DEFAULT_RATE_LIMITS.invitations, 'invitations sent');
  return [
    defineRoute({
      method: 'get',
      path: '/invitations',
      auth: { permission: 'invitations.manage' },
      summary: 'List pending invitations.',
      response: { status: 200, description: 'The invitations not yet accepted, revoked or expired.' },
      handle: async ({ lab }): Promise<PendingInvitationsAnswer> => ({ invitations: (await deps.invitations.listPending(lab)).map(presentInvitation) }),
    }),
    defineRoute({
      method: 'post',
      path: '/invitations',
      auth: { permission: 'invitations.manage' },
      summary: 'Invite someone by e-mail with a role.',
      body: inviteMemberSchema,
      before: [limit],
      response: { status: 201, description: 'The invitation; its link was mailed to the address.' },
      errors: {
        402: "`plan_limit_reached`: the lab's plan allows no more members (pending invitations count). Retry-After; a lab admin can raise the plan under Billing.",
        409: '`already_member`: the address belongs to a member already; `invitation_pending`: an invitation to it is pending (resend that one).',
        ...MAIL_ERRORS,
      },
      handle: async ({ lab, actor, body }): Promise<InvitationAnswer> => ({ invitation: presentInvitation(await deps.invitations.invite(lab, actor, body)) }),
    }),
    defineRoute({
      method: 'post',
      path: '/invitations/:id/resend',
      auth: { permission: 'invitations.manage' },
      summary: 'Send a pending invitation again with a fresh link.',
      params: invitationParams,
      before: [limit],
      response: { status: 200, description: 'The invitation with its new expiry; the old link stops working.' },
      errors: MAIL_ERRORS,
      handle: async ({ lab, actor, params }): Promise<InvitationAnswer> => ({
        invitation: presentInvitation(await deps.invitations.resend(lab, actor, params.id)),
      }),
    }),
    defineRoute({
      method: 'delete',
      path: '/invitations/:id',
      auth: { permission: 'invitations.manage' },
      summary: 'Revoke a pending invitation.',
      params: invitationParams,
      response: { status: 204, description: 'Revoked: the link stops working at once.' },
      handle: async ({ lab, actor, params }) => deps.invitations.revoke(lab, actor, params.id),
    }),
  ];
}

/** The invited person's side: preview the link and accept it (any signed-in person). */
export function invitationAcceptanceRoutes(deps: { invitations: InvitationsService }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/api/v1/invitations/:lab/:token',
      auth: 'session',
      summary: 'Preview an invitation link before accepting it.',
      params: invitationLinkParams,
      response: { status: 200, description: 'The lab, role and address the link offers, and whether the signed-in person is that address.' },
      errors: { 404: LINK_NOT_FOUND, 410: GONE },
      handle: async ({ params, actor }): Promise<InvitationPreview> => {
        const p = await deps.invitations.preview(params.lab, params.token, actor);
        return {
          invitation: {
            lab: p.lab,
            role: p.invitation.role,
            email: p.invitation.email,
            invitedBy: p.invitation.invitedBy ? { name: p.invitation.invitedBy.name } : null,
            expiresAt: p.invitation.expiresAt.toISOString(),
          },
          matchesSignedInUser: p.matchesSignedInUser,
        };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/api/v1/invitations/:lab/:token/accept',
      auth: 'session',
      summary: 'Accept an invitation and join the lab with its role.',
      params: invitationLinkParams,
      response: { status: 200, description: 'The lab joined and the role taken.' },
      errors: {
        403: '`invitation_wrong_account`: the invitation is for another address (sign in with the invited, verified address); `cross_site_request`: a write from another site.',
        404: LINK_NOT_FOUND,
        409: '`already_member`: you are already a member of this lab.',
        410: GONE,
      },
      handle: async ({ params, actor }): Promise<AcceptedInvitation> => {
        const result = await deps.invitations.accept(params.lab, params.token, actor);
        return { lab: { slug: result.lab.slug, name: result.lab.name }, role: result.role };
      },
    }),
  ];
}
