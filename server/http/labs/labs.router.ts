import { Router } from 'express';
import { requireUser } from '../middleware/require-user.ts';
import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { createLabSchema } from './labs.schema.ts';
import { presentLabForMember } from '../presenters/labs.presenter.ts';
import type { LabsService } from '../../services/labs.service.ts';
import type { LabRoute } from '../lab-routes.ts';

/** `POST /api/v1/labs`: any signed-in person creates a lab and becomes its admin. */
export function labsRouter(deps: { labs: LabsService }): Router {
  const router = Router();
  router.post('/api/v1/labs', requireUser, async (req, res) => {
    const input = parseInput(createLabSchema, req.body);
    const lab = await deps.labs.create(actorOf(req), input);
    res.status(201).json({ lab: { slug: lab.slug, name: lab.name, role: 'admin' } });
  });
  return router;
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
