import type { Request, RequestHandler, Response } from 'express';
import type { Db } from '../../db/create-db.ts';
import { createLabsRepo } from '../../db/labs.repo.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { membershipsIn } from '../../db/memberships.repo.ts';
import { can, type Permission } from '../../policies/permissions.ts';
import { ForbiddenError, NotFoundError, UnauthenticatedError } from '../../errors.ts';
import type { Actor, LabContext } from '../../services/lab-context.ts';

/** The message for a lab that does not exist or that the person does not belong to (same answer). */
export const NO_SUCH_LAB = 'No lab at this address, or you are not a member of it.';

/**
 * The lab and role guard in front of every `/api/v1/labs/:lab/...` route: signed in →
 * the lab exists → the person is a member (else 404, so a lab's existence never leaks) →
 * the role has the route's permission (else 403). The membership is read on every request,
 * so a removed member loses access on their next request.
 */
export function createLabGuard(db: Db) {
  const labs = createLabsRepo(db);
  return (permission: Permission): RequestHandler =>
    async (req, res, next) => {
      if (!req.user) throw new UnauthenticatedError();
      const slug = String(req.params.lab ?? '');
      const lab = /^[a-z0-9-]{1,64}$/.test(slug) ? await labs.findBySlug(slug) : null;
      if (!lab) throw new NotFoundError(NO_SUCH_LAB);
      const role = await membershipsIn(inLab(db, lab.id)).roleOf(req.user.id);
      if (!role) throw new NotFoundError(NO_SUCH_LAB);
      if (!can(role, permission)) throw new ForbiddenError();
      res.locals.lab = { ...lab, role } satisfies LabContext;
      next();
    };
}

export type LabGuard = ReturnType<typeof createLabGuard>;

/** The lab the guard resolved for this request. */
export function labOf(res: Response): LabContext {
  const lab = res.locals.lab as LabContext | undefined;
  if (!lab) throw new Error('labOf: the lab guard did not run for this route');
  return lab;
}

/** The signed-in person as services need them. */
export function actorOf(req: Request): Actor {
  if (!req.user) throw new UnauthenticatedError();
  const { id, email, emailVerified, displayName } = req.user;
  return { id, email, emailVerified, displayName };
}
