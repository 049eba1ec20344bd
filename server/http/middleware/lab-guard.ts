import type { Request, RequestHandler, Response } from 'express';
import type { Db } from '../../db/create-db.ts';
import { createLabsRepo } from '../../db/labs.repo.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { membershipsIn } from '../../db/memberships.repo.ts';
import { can, type Permission } from '../../policies/permissions.ts';
import { AppError, ForbiddenError, NotFoundError, UnauthenticatedError } from '../../errors.ts';
import type { PersonalTokenHolder, PersonalTokensService } from '../../services/personal-tokens.service.ts';
import type { Actor, LabContext } from '../../services/lab-context.ts';

/** The message for a lab that does not exist or that the person does not belong to (same answer). */
export const NO_SUCH_LAB = 'No lab at this address, or you are not a member of it.';

/** Permissions a personal token may exercise, and only on GET routes (reading, never changing). */
export const TOKEN_READ_PERMISSIONS: readonly Permission[] = ['lab.read', 'loggers.read', 'channels.read', 'diagnostics.read', 'exports.create'];

/** A personal token presented on a route it cannot use (any write, or a read outside the list). */
export class TokenNotAllowedError extends AppError {
  constructor() {
    super(403, 'token_not_allowed', 'Personal tokens can only read.');
  }
}

const PERSONAL_TOKEN_HEADER = /^Bearer\s+(lbt_\S*)$/i;

/**
 * The lab and role guard in front of every `/api/v1/labs/:lab/...` route: signed in →
 * the lab exists → the person is a member (else 404, so a lab's existence never leaks) →
 * the role has the route's permission (else 403). The membership is read on every request,
 * so a removed member loses access on their next request.
 *
 * Without a session, `Authorization: Bearer lbt_…` (a personal token) is accepted on GET
 * routes whose permission is in TOKEN_READ_PERMISSIONS (else 403 token_not_allowed); the token
 * must be valid (else 401 invalid_token) and belong to the URL's lab (else 404), and its owner's
 * CURRENT role is the one checked, so a token never grants more than its owner has now.
 */
export function createLabGuard(db: Db, deps: { tokens?: PersonalTokensService } = {}) {
  const labs = createLabsRepo(db);

  /** The person acting: the session's user, or the owner of a personal token (with the token). */
  async function callerOf(req: Request, permission: Permission): Promise<{ userId: number; token: PersonalTokenHolder | null }> {
    if (req.user) return { userId: req.user.id, token: null };
    const presented = PERSONAL_TOKEN_HEADER.exec(req.get('authorization') ?? '')?.[1];
    if (!presented || !deps.tokens) throw new UnauthenticatedError();
    if (!(req.method === 'GET' || req.method === 'HEAD') || !TOKEN_READ_PERMISSIONS.includes(permission)) throw new TokenNotAllowedError();
    const token = await deps.tokens.authenticate(presented);
    return { userId: token.userId, token };
  }

  return (permission: Permission): RequestHandler =>
    async (req, res, next) => {
      const caller = await callerOf(req, permission);
      const slug = String(req.params.lab ?? '');
      const lab = /^[a-z0-9-]{1,64}$/.test(slug) ? await labs.findBySlug(slug) : null;
      if (!lab || (caller.token && caller.token.tenantId !== lab.id)) throw new NotFoundError(NO_SUCH_LAB);
      const role = await membershipsIn(inLab(db, lab.id)).roleOf(caller.userId);
      if (!role) throw new NotFoundError(NO_SUCH_LAB);
      if (!can(role, permission)) throw new ForbiddenError();
      if (caller.token) await deps.tokens!.recordUse(caller.token);
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
