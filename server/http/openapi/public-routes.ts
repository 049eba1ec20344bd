import { z } from 'zod';

/** How a route outside the lab table is reached (lab routes are described by their permission). */
export type PublicRouteAuth = 'none' | 'session' | 'ingest-key';

/** A route outside the lab route table, documented in the API document. */
export interface PublicRoute {
  method: 'get' | 'post' | 'patch';
  /** Express-style path, e.g. `/api/v1/invitations/:lab/:token`. */
  path: string;
  summary: string;
  auth: PublicRouteAuth;
  /** Request bodies by media type (the zod schema the route validates with, where it has one). */
  bodies?: Record<string, z.ZodType>;
  /** Answers beyond the usual ones, by status (a 4XX/5XX one carries the error body). */
  responses?: Record<string, string>;
}

/**
 * Every route outside the lab route table that the API serves, for the API document.
 * The OpenAPI test walks the app's router and fails when a route is missing here.
 */
export const PUBLIC_ROUTES: PublicRoute[] = [];
