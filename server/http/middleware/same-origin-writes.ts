import type { RequestHandler } from 'express';
import { AppError } from '../../errors.ts';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request forgery guard for cookie-authenticated writes: a browser always sends
 * `Origin` (or at least `Sec-Fetch-Site`) on a cross-site POST, so a write whose origin is not
 * Lagbook's own is refused. Requests without either header come from scripts and machines,
 * which carry no ambient cookie to abuse. The session cookie is also SameSite=Lax.
 */
export function sameOriginWrites(publicUrl: string): RequestHandler {
  const ownOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    const site = req.get('sec-fetch-site');
    const crossSite = (origin !== undefined && origin !== ownOrigin) || (site !== undefined && site !== 'same-origin' && site !== 'none');
    if (crossSite) throw new AppError(403, 'cross_site_request', 'Writes are accepted only from Lagbook itself.');
    next();
  };
}
