import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { z } from 'zod';
import type { Permission } from '../policies/permissions.ts';
import type { LabGuard } from './middleware/lab-guard.ts';

/** One lab route: below `/api/v1/labs/:lab`, with the permission it needs. */
export interface LabRoute {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Path below `/api/v1/labs/:lab`, e.g. `/members/:userId` ('' for the lab itself). */
  path: string;
  permission: Permission;
  /** One short sentence for the API document (`GET /api/v1/openapi.json`). */
  summary: string;
  /** The schema the handler validates its body with (documented from the same object). */
  body?: z.ZodType;
  /** Media type of the body when it is not JSON (e.g. an uploaded `text/csv` file). */
  bodyMediaType?: string;
  /** The schema the handler validates its query string with. */
  query?: z.ZodType;
  /** Answers beyond the usual ones, by status, for the API document (e.g. `'429': 'diagnostics_busy: …'`). */
  responses?: Record<string, string>;
  /** A rate limit applied after the guard (so it can count per signed-in person). */
  limit?: RequestHandler;
  handle: (req: Request, res: Response) => Promise<void>;
}

/** What the route table exposes (tests generate the role matrix from it; the API document too). */
export type LabRouteSummary = Omit<LabRoute, 'handle' | 'limit'>;

/**
 * Mounts lab routes behind the one lab guard. Every lab route is declared through here, so
 * none can exist without a permission, and the role × route test sees all of them.
 */
export function mountLabRoutes(guard: LabGuard, routes: LabRoute[]): { router: Router; table: LabRouteSummary[] } {
  const router = Router();
  for (const r of routes) {
    const chain: RequestHandler[] = r.limit ? [guard(r.permission), r.limit] : [guard(r.permission)];
    router[r.method](`/api/v1/labs/:lab${r.path}`, ...chain, r.handle);
  }
  return { router, table: routes.map(({ handle: _handle, limit: _limit, ...summary }) => summary) };
}
