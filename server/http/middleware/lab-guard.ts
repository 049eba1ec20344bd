import type { Request, RequestHandler, Response } from 'express';
import type { Db } from '../../db/create-db.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
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
 * the lab exists and the person is a member (else 404, so a lab's existence never leaks: one
 * statement reads the lab with the person's membership, and comes back empty the same way for
 * a lab that is someone else's and for one that does not exist) → the role has the route's
 * permission (else 403). The membership is read on every request, so a removed member loses
 * access on their next request.
 *
 * Without a session, `Authorization: Bearer lbt_…` (a personal token) is accepted on GET
 * routes whose permission is in TOKEN_READ_PERMISSIONS (else 403 token_not_allowed); the token
 * must be valid (else 401 invalid_token) and belong to the URL's lab (else 404), and its owner's
 * CURRENT role is the one checked, so a token never grants more than its owner has now.
 */
export function createLabGuard(db: Db, deps: { tokens?: PersonalTokensService } = {}) {
  const crossLab = crossLabRepo(db);

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
      // One statement whether the lab is someone else's or does not exist: both come back empty.
      // (A slug no lab can have — wrong characters or length — is not looked up: that tells nothing about any lab.)
      const found = /^[a-z0-9-]{1,64}$/.test(slug) ? await crossLab.labForMember(slug, caller.userId) : null;
      if (!found || (caller.token && caller.token.tenantId !== found.id)) throw new NotFoundError(NO_SUCH_LAB);
      const { role, ...lab } = found;
      if (!can(role, permission)) throw new ForbiddenError();
      if (caller.token) await deps.tokens!.recordUse(caller.token);
      res.locals.lab = { ...lab, role } satisfies LabContext;
      res.locals.callerUserId = caller.userId;
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

/** The id of the person acting on this lab route (the session's user or a personal token's owner). */
export function callerIdOf(res: Response): number {
  const id = res.locals.callerUserId as number | undefined;
  if (id === undefined) throw new Error('callerIdOf: the lab guard did not run for this route');
  return id;
}

/** The signed-in person as services need them. */
export function actorOf(req: Request): Actor {
  if (!req.user) throw new UnauthenticatedError();
  const { id, email, emailVerified, displayName } = req.user;
  return { id, email, emailVerified, displayName };
}
