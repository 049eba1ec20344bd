import { Router } from 'express';

/** `GET /api/v1/openapi.json`: the API document, public (no session, no token). */
export function openApiRouter(deps: { document: object }): Router {
  const router = Router();
  const body = JSON.stringify(deps.document);
  router.get('/api/v1/openapi.json', (_req, res) => {
    res.type('application/json').set('Cache-Control', 'public, max-age=300').send(body);
  });
  return router;
}
