import { Router } from 'express';
import { requireUser } from './middleware/require-user.ts';
import type { MeService } from '../services/me.service.ts';
import { presentMe } from './presenters/me.presenter.ts';
import { parseInput } from './validate.ts';
import { updateMeSchema } from './me.schema.ts';

/** `GET /api/v1/me`: the signed-in person and their labs; `PATCH /api/v1/me`: their own settings. */
export function meRouter(deps: { me: MeService }): Router {
  const router = Router();
  router.get('/api/v1/me', requireUser, async (req, res) => {
    res.json(presentMe(await deps.me.describe(req.user!)));
  });
  router.patch('/api/v1/me', requireUser, async (req, res) => {
    const { timeZone } = parseInput(updateMeSchema, req.body);
    res.json(presentMe(await deps.me.setTimeZone(req.user!, timeZone)));
  });
  return router;
}
