import express, { Router } from 'express';
import { existsSync } from 'node:fs';
import { join } from 'node:path';

/**
 * Serves the built client (vite build output): hashed assets cached for a year, and
 * index.html for every other GET that is not an API, auth or health path, so client-side
 * routes survive a reload.
 */
export function staticClient(clientDir: string): Router {
  const router = Router();
  const index = join(clientDir, 'index.html');
  if (!existsSync(index)) {
    throw new Error(`The built client is missing (${index}); run the client build first.`);
  }
  router.use('/assets', express.static(join(clientDir, 'assets'), { immutable: true, maxAge: '1y', fallthrough: false }));
  router.use(express.static(clientDir, { index: false, maxAge: 0 }));
  router.get(/^\/(?!api\/|auth\/|healthz).*/, (_req, res) => {
    res.set('Cache-Control', 'no-cache');
    // `root` rather than an absolute path: send refuses absolute paths with a dot-folder in
    // them (a client built under .lagbook/ would answer 404 otherwise).
    res.sendFile('index.html', { root: clientDir });
  });
  return router;
}
