import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { z } from 'zod';
import { zodToValidationError } from '../middleware/error-handler.ts';
import { requireUser } from '../middleware/require-user.ts';
import { actorOf, callerIdOf, labOf, type LabGuard } from '../middleware/lab-guard.ts';
import { answersOf } from './standard-answers.ts';
import { fullPathOf, permissionOf, type Route, type RouteInput } from './route.ts';

export interface MountContext {
  /** The lab and role guard (lab routes). */
  guard: LabGuard;
  /**
   * Called when a route answers with a status its table entry does not document (tests fail on
   * it, so the API document cannot fall behind what the routes really answer).
   */
  onUndocumentedStatus?: (where: string, status: number) => void;
}

/**
 * Parses one part of the request with its schema; a failure is the one invalid-input answer
 * (400), its fields named with the labels of the route's catalogue (`routePath`).
 */
function parsePart<S extends z.ZodType>(schema: S | undefined, input: unknown, routePath: string): unknown {
  if (!schema) return undefined;
  const result = schema.safeParse(input);
  if (!result.success) throw zodToValidationError(result.error, routePath);
  return result.data;
}

/** An AbortSignal that fires when the client goes away before the answer is complete. */
function signalOnDisconnect(res: Response): AbortSignal {
  const controller = new AbortController();
  res.once('close', () => {
    if (!res.writableFinished) controller.abort();
  });
  return controller.signal;
}

/** The handler's input: parsed params, query and body, and accessors for who acts where. */
function inputOf(route: Route, req: Request, res: Response): RouteInput<unknown, unknown, unknown> {
  return {
    params: parsePart(route.params, req.params, route.path),
    query: parsePart(route.query, req.query, route.path),
    body: parsePart(route.body, req.body, route.path),
    get lab() {
      return labOf(res);
    },
    get actor() {
      return actorOf(req);
    },
    get callerId() {
      return callerIdOf(res);
    },
    setHeader: (name, value) => {
      res.set(name, value);
    },
    signal: signalOnDisconnect(res),
  };
}

/** The authentication step a route's `auth` asks for (ingest keys and webhook signatures are checked by the route). */
function authStep(route: Route, guard: LabGuard): RequestHandler[] {
  const permission = permissionOf(route);
  if (permission) return [guard(permission)];
  if (route.auth === 'session') return [requireUser];
  return [];
}

/** Reports answers with a status the route does not document. */
function statusWatch(route: Route, onUndocumented: NonNullable<MountContext['onUndocumentedStatus']>): RequestHandler {
  const documented = new Set(answersOf(route).keys());
  const where = `${route.method.toUpperCase()} ${fullPathOf(route)}`;
  return (_req, res, next) => {
    res.once('finish', () => {
      if (!documented.has(res.statusCode)) onUndocumented(where, res.statusCode);
    });
    next();
  };
}

/**
 * Mounts a route table: for each entry, authentication (its `auth`), its `before` middleware,
 * then input parsing (params → query → body; any failure answers 400 `invalid_input`), then the
 * handler. A handler returns its answer, written as JSON with the entry's success status (204:
 * no body); a streaming route writes its own answer. When the client has gone away, a failure of
 * the aborted work is dropped silently (there is no one to answer, and nothing went wrong).
 */
export function mountRoutes(routes: readonly Route[], ctx: MountContext): Router {
  const router = Router();
  for (const route of routes) {
    const chain: RequestHandler[] = [];
    if (ctx.onUndocumentedStatus) chain.push(statusWatch(route, ctx.onUndocumentedStatus));
    chain.push(...authStep(route, ctx.guard), ...(route.before ?? []));
    chain.push(async (req, res) => {
      const input = inputOf(route, req, res);
      let answer: unknown;
      try {
        if (route.stream) {
          await route.handle(input, { req, res });
          return;
        }
        answer = await route.handle(input);
      } catch (err) {
        // the client left and the handler's work was aborted (e.g. an engine run): nobody to answer
        if (input.signal.aborted) return;
        throw err;
      }
      if (input.signal.aborted) return;
      if (route.response.status === 204) res.status(204).end();
      else if (answer === undefined) throw new Error(`${route.method} ${route.path}: the handler gave no answer`);
      else res.status(route.response.status).json(answer);
    });
    router[route.method](fullPathOf(route), ...chain);
  }
  return router;
}
