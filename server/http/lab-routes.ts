import { Router, type Request, type Response } from 'express';
import type { Permission } from '../policies/permissions.ts';
import type { LabGuard } from './middleware/lab-guard.ts';

/** One lab route: below `/api/v1/labs/:lab`, with the permission it needs. */
export interface LabRoute {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  /** Path below `/api/v1/labs/:lab`, e.g. `/members/:userId` ('' for the lab itself). */
  path: string;
  permission: Permission;
  handle: (req: Request, res: Response) => Promise<void>;
}

/** What the route table exposes (tests generate the role matrix from it). */
export type LabRouteSummary = Pick<LabRoute, 'method' | 'path' | 'permission'>;

/**
 * Mounts lab routes behind the one lab guard. Every lab route is declared through here, so
 * none can exist without a permission, and the role × route test sees all of them.
 */
export function mountLabRoutes(guard: LabGuard, routes: LabRoute[]): { router: Router; table: LabRouteSummary[] } {
  const router = Router();
  for (const r of routes) {
    router[r.method](`/api/v1/labs/:lab${r.path}`, guard(r.permission), r.handle);
  }
  return { router, table: routes.map(({ method, path, permission }) => ({ method, path, permission })) };
}
