import { Router } from 'express';
import { z } from 'zod';
import { requireUser } from '../middleware/require-user.ts';
import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { inviteMemberSchema } from './labs.schema.ts';
import { presentInvitation } from '../presenters/labs.presenter.ts';
import type { InvitationsService } from '../../services/invitations.service.ts';
import type { LabRoute } from '../lab-routes.ts';
import { DEFAULT_RATE_LIMITS, perPersonLimit, type RateLimit } from '../middleware/rate-limits.ts';

const idParam = z.object({ id: z.coerce.number().int('must be a whole number').positive('must be a positive number') });

/**
 * Admins list, create, resend and revoke a lab's pending invitations. Creating and resending
 * send mail, so they share one per-admin rate limit (`sendLimit`).
 */
export function invitationRoutes(deps: { invitations: InvitationsService; sendLimit?: RateLimit }): LabRoute[] {
  const limit = perPersonLimit(deps.sendLimit ?? DEFAULT_RATE_LIMITS.invitations, 'invitations sent');
  return [
    {
      method: 'get',
      path: '/invitations',
      permission: 'invitations.manage',
      summary: 'List pending invitations.',
      handle: async (_req, res) => {
        const list = await deps.invitations.listPending(labOf(res));
        res.json({ invitations: list.map(presentInvitation) });
      },
    },
    {
      method: 'post',
      path: '/invitations',
      permission: 'invitations.manage',
      summary: 'Invite someone by e-mail with a role.',
      body: inviteMemberSchema,
      limit,
      handle: async (req, res) => {
        const input = parseInput(inviteMemberSchema, req.body);
        const invitation = await deps.invitations.invite(labOf(res), actorOf(req), input);
        res.status(201).json({ invitation: presentInvitation(invitation) });
      },
    },
    {
      method: 'post',
      path: '/invitations/:id/resend',
      permission: 'invitations.manage',
      summary: 'Send a pending invitation again with a fresh link.',
      limit,
      handle: async (req, res) => {
        const { id } = parseInput(idParam, req.params);
        const invitation = await deps.invitations.resend(labOf(res), actorOf(req), id);
        res.json({ invitation: presentInvitation(invitation) });
      },
    },
    {
      method: 'delete',
      path: '/invitations/:id',
      permission: 'invitations.manage',
      summary: 'Revoke a pending invitation.',
      handle: async (req, res) => {
        const { id } = parseInput(idParam, req.params);
        await deps.invitations.revoke(labOf(res), actorOf(req), id);
        res.status(204).end();
      },
    },
  ];
}

/** The invited person's side: preview the link and accept it (any signed-in person). */
export function invitationAcceptanceRouter(deps: { invitations: InvitationsService }): Router {
  const router = Router();
  router.get('/api/v1/invitations/:lab/:token', requireUser, async (req, res) => {
    const p = await deps.invitations.preview(String(req.params.lab), String(req.params.token), actorOf(req));
    res.json({
      invitation: {
        lab: p.lab,
        role: p.invitation.role,
        email: p.invitation.email,
        invitedBy: p.invitation.invitedBy ? { name: p.invitation.invitedBy.name } : null,
        expiresAt: p.invitation.expiresAt.toISOString(),
      },
      matchesSignedInUser: p.matchesSignedInUser,
    });
  });
  router.post('/api/v1/invitations/:lab/:token/accept', requireUser, async (req, res) => {
    const result = await deps.invitations.accept(String(req.params.lab), String(req.params.token), actorOf(req));
    res.json({ lab: { slug: result.lab.slug, name: result.lab.name }, role: result.role });
  });
  return router;
}
