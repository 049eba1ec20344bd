import { Router } from 'express';
import { requireUser } from '../middleware/require-user.ts';
import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { createLabSchema } from './labs.schema.ts';
import { presentLabForMember } from '../presenters/labs.presenter.ts';
import type { CreatedLab, LabsService } from '../../services/labs.service.ts';
import type { LabRoute } from '../lab-routes.ts';

/**
 * `POST /api/v1/labs`: any signed-in person creates a lab and becomes its admin (up to their
 * account's cap, else 403 lab_limit_reached). 201 with the lab and `requestedSlug`, the address
 * asked for (or derived from the name): when that one was unavailable the lab got a variant
 * (`lab.slug` differs), and the answer is otherwise the same, so it never tells whether some
 * other lab uses an address.
 */
export function labsRouter(deps: { labs: LabsService }): Router {
  const router = Router();
  router.post('/api/v1/labs', requireUser, async (req, res) => {
    const input = parseInput(createLabSchema, req.body);
    res.status(201).json(presentCreatedLab(await deps.labs.create(actorOf(req), input)));
  });
  return router;
}

/** The answer to `POST /api/v1/labs`: the new lab with the creator's role, and the address asked for. */
export function presentCreatedLab({ lab, requestedSlug }: CreatedLab) {
  return { lab: { slug: lab.slug, name: lab.name, role: 'admin' as const }, requestedSlug };
}

/** `GET /api/v1/labs/:lab`: the lab, the member's role and permissions. */
export function labRoutes(): LabRoute[] {
  return [
    {
      method: 'get',
      path: '',
      permission: 'lab.read',
      summary: 'The lab, your role in it and what that role may do.',
      handle: async (_req, res) => {
        const lab = labOf(res);
        res.json(presentLabForMember(lab, lab.role));
      },
    },
  ];
}
