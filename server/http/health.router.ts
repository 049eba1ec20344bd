import { Router } from 'express';
import { databaseAnswers, type Db } from '../db/create-db.ts';

/** `GET /healthz`: 200 when the database answers, 503 otherwise (for load balancers and scripts). */
export function healthRouter(deps: { db: Db }): Router {
  const router = Router();
  router.get('/healthz', async (_req, res) => {
    const ok = await databaseAnswers(deps.db);
    res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', database: ok ? 'ok' : 'unreachable' });
  });
  return router;
}
