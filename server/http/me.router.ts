import { Router } from 'express';
import { requireUser } from './middleware/require-user.ts';
import type { MeService } from '../services/me.service.ts';
import { presentMe } from './presenters/me.presenter.ts';

/** `GET /api/v1/me`: the signed-in person and their labs. */
export function meRouter(deps: { me: MeService }): Router {
  const router = Router();
  router.get('/api/v1/me', requireUser, async (req, res) => {
    res.json(presentMe(await deps.me.describe(req.user!)));
  });
  return router;
}
