import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import type { Permission } from '../policies/permissions.ts';
import type { Route } from './routes/route.ts';

/**
 * TRANSITIONAL: the old shape of a lab route, whose handler parses its own input and writes its
 * own answer. `fromLabRoutes` puts such routes into the one route table until each area declares
 * its routes with `defineRoute`.
 */
export interface LabRoute {
  method: 'get' | 'post' | 'patch' | 'put' | 'delete';
  path: string;
  permission: Permission;
  summary: string;
  body?: z.ZodType;
  bodyMediaType?: string;
  query?: z.ZodType;
  responses?: Record<string, string>;
  limit?: RequestHandler;
  handle: (req: Request, res: Response) => Promise<void>;
}

/** Marks a route whose handler still parses its input itself (the mount function does not). */
export const PARSES_ITSELF = Symbol('parses its own input');

/** Old-shape lab routes as route-table entries (TRANSITIONAL). */
export function fromLabRoutes(routes: LabRoute[]): Route[] {
  return routes.map((r) => {
    const errors = Object.fromEntries(Object.entries(r.responses ?? {}).map(([status, text]) => [Number(status), text]));
    return {
      method: r.method,
      path: r.path,
      auth: { permission: r.permission },
      summary: r.summary,
      ...(r.query ? { query: r.query } : {}),
      ...(r.body ? { body: r.body } : {}),
      ...(r.body && r.bodyMediaType ? { bodyMediaTypes: { [r.bodyMediaType]: r.body } } : {}),
      response: { status: 200, description: 'Success.' },
      errors,
      before: r.limit ? [r.limit] : [],
      stream: true,
      [PARSES_ITSELF]: true,
      handle: async (_input, raw) => r.handle(raw.req, raw.res),
    } as Route;
  });
}
