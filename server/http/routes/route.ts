import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import type { Permission } from '../../policies/permissions.ts';
import type { Actor, LabContext } from '../../services/lab-context.ts';

/**
 * How a route is reached:
 * - `none`: open to anyone (health, the API document, Stripe's webhook, which checks its own signature);
 * - `session`: a signed-in person;
 * - `{ permission }`: a member of the URL's lab whose role has the permission (path below
 *   `/api/v1/labs/:lab`); a personal token is accepted too on GET routes whose permission is
 *   token-readable (see lab-guard.ts);
 * - `ingest-key`: a logger's ingest key (the route checks it);
 * - `webhook-signature`: the payment service's signed webhook (the route checks it).
 */
export type RouteAuth = 'none' | 'session' | 'ingest-key' | 'webhook-signature' | { permission: Permission };

export type HttpMethod = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** What a handler receives: the parsed input and who acts where. */
export interface RouteInput<P, Q, B> {
  params: P;
  query: Q;
  body: B;
  /** The lab the guard resolved (lab routes only; reading it elsewhere is a programming error). */
  readonly lab: LabContext;
  /** The signed-in person (401 when there is none, e.g. a personal token on a write). */
  readonly actor: Actor;
  /** The person acting: the session's user or a personal token's owner (lab routes only). */
  readonly callerId: number;
  /** Sets a header on the answer (e.g. `Lagbook-History-Starts`). */
  setHeader(name: string, value: string): void;
  /** Fires when the client goes away before the answer is complete (long engine runs stop). */
  signal: AbortSignal;
}

/** The success answer of a route, for the API document and the mount function. */
export interface RouteSuccess {
  status: 200 | 201 | 202 | 204;
  description: string;
  /** Media type of the answer; JSON unless said otherwise (`text/csv` exports). */
  mediaType?: string;
}

interface RouteCommon<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType> {
  method: HttpMethod;
  /** Absolute path, or for lab routes the path below `/api/v1/labs/:lab` (`''` for the lab itself). */
  path: string;
  auth: RouteAuth;
  /** One short sentence for the API document (`GET /api/v1/openapi.json`). */
  summary: string;
  /** Grouping in the API document (default: derived from the path or the auth). */
  tag?: string;
  params?: P;
  query?: Q;
  /** The body schema; parsed before the handler runs (JSON unless `bodyMediaTypes` says otherwise). */
  body?: B;
  /** Media types the body is documented with, each with its schema (default: `application/json` → `body`). */
  bodyMediaTypes?: Record<string, z.ZodType>;
  response: RouteSuccess;
  /** The answers this route gives beyond the standard ones (see standard-answers.ts), by status. */
  errors?: Record<number, string>;
  /** Middleware run after authentication and before parsing (rate limits, body readers). */
  before?: RequestHandler[];
  /** Whether the route reads the database (it can then answer 503); default true. */
  usesDatabase?: boolean;
}

type Inferred<S> = S extends z.ZodType ? z.infer<S> : undefined;

/** A route whose handler returns its answer; the mount function writes it with `response.status`. */
export interface AnsweringRoute<P extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType, B extends z.ZodType = z.ZodType> extends RouteCommon<
  P,
  Q,
  B
> {
  stream?: false;
  handle(input: RouteInput<Inferred<P>, Inferred<Q>, Inferred<B>>): Promise<unknown>;
}

/**
 * A streaming route: it opts in to write its answer itself (exports, the cached diagnostics bytes)
 * or to read its body as a stream (logger batches). It still gets its input parsed.
 */
export interface StreamingRoute<P extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType, B extends z.ZodType = z.ZodType> extends RouteCommon<
  P,
  Q,
  B
> {
  stream: true;
  handle(input: RouteInput<Inferred<P>, Inferred<Q>, Inferred<B>>, raw: { req: Request; res: Response }): Promise<void>;
}

/** One entry of the route table. */
export type Route = AnsweringRoute | StreamingRoute;

/** Declares a route with its handler typed from its schemas (the identity at run time). */
export function defineRoute<P extends z.ZodType = z.ZodUndefined, Q extends z.ZodType = z.ZodUndefined, B extends z.ZodType = z.ZodUndefined>(
  route: AnsweringRoute<P, Q, B> | StreamingRoute<P, Q, B>,
): Route {
  return route as unknown as Route;
}

/** The permission of a lab route, or null for a route outside the lab table. */
export function permissionOf(route: Pick<Route, 'auth'>): Permission | null {
  return typeof route.auth === 'object' ? route.auth.permission : null;
}

/**
 * Whether a route is mounted before the session middleware: routes that need no session (health,
 * the API document) or authenticate otherwise (a logger's key, a signed webhook that must see the
 * raw body) skip the session store and the JSON parser.
 */
export function runsBeforeSession(route: Pick<Route, 'auth'>): boolean {
  return route.auth === 'none' || route.auth === 'ingest-key' || route.auth === 'webhook-signature';
}

/** The prefix of every lab route. */
export const LAB_PREFIX = '/api/v1/labs/:lab';

/** The Express path a route is mounted at. */
export function fullPathOf(route: Pick<Route, 'auth' | 'path'>): string {
  return permissionOf(route) ? `${LAB_PREFIX}${route.path}` : route.path;
}

/** A lab route as the role × route matrix and the isolation suite see it (path below the lab). */
export interface LabRouteSummary {
  method: HttpMethod;
  path: string;
  permission: Permission;
  summary: string;
}

/** The lab routes of a table, for the generated role × route matrix and the isolation suite. */
export function labRouteSummaries(routes: readonly Route[]): LabRouteSummary[] {
  return routes.flatMap((r) => {
    const permission = permissionOf(r);
    return permission ? [{ method: r.method, path: r.path, permission, summary: r.summary }] : [];
  });
}
