import express, { type RequestHandler } from 'express';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { errorHandler } from '../middleware/error-handler.ts';
import { createLogWriter } from '../../log-writer.ts';
import { ConflictError } from '../../services/service-errors.ts';
import type { LabGuard } from '../middleware/lab-guard.ts';
import { idParams } from '../../contract/common.ts';
import { mountRoutes } from './mount-routes.ts';
import { answersOf } from './standard-answers.ts';
import { defineRoute, labRouteSummaries, type Route } from './route.ts';

/** A stand-in for the lab guard: every request acts in lab 7 as user 3 (the real guard has its API tests). */
const guard: LabGuard = () =>
  ((_req, res, next) => {
    res.locals.lab = { id: 7, slug: 'seven', name: 'Seven', createdAt: new Date(0), role: 'admin' };
    res.locals.callerUserId = 3;
    next();
  }) as RequestHandler;

const itemParams = idParams('itemId');
const renameBody = z.object({ name: z.string({ error: 'must be text' }).min(2, 'must be at least 2 characters') });
const listQuery = z.object({ limit: z.coerce.number().int('must be a whole number').max(50, 'must be at most 50').default(10) });

const routes: Route[] = [
  defineRoute({
    method: 'get',
    path: '/items',
    auth: { permission: 'lab.read' },
    summary: 'List.',
    query: listQuery,
    response: { status: 200, description: 'The items.' },
    handle: async ({ query, lab, callerId }) => ({ limit: query.limit, lab: lab.slug, callerId }),
  }),
  defineRoute({
    method: 'patch',
    path: '/items/:itemId',
    auth: { permission: 'lab.read' },
    summary: 'Rename.',
    params: itemParams,
    body: renameBody,
    response: { status: 200, description: 'The item.' },
    errors: { 409: '`name_taken`: another item has the name.' },
    handle: async ({ params, body }) => {
      if (body.name === 'taken') throw new ConflictError('name_taken', 'Another item has the name.');
      return { id: params.itemId, name: body.name };
    },
  }),
  defineRoute({
    method: 'delete',
    path: '/items/:itemId',
    auth: { permission: 'lab.read' },
    summary: 'Delete.',
    params: itemParams,
    response: { status: 204, description: 'Deleted.' },
    handle: async () => 'ignored',
  }),
  defineRoute({
    method: 'get',
    path: '/api/v1/items.csv',
    auth: 'none',
    summary: 'Export.',
    usesDatabase: false,
    response: { status: 200, description: 'CSV.', mediaType: 'text/csv' },
    stream: true,
    handle: async (_input, { res }) => {
      res.type('text/csv').end('a,b\n1,2\n');
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/v1/slow',
    auth: 'none',
    summary: 'Runs until the client leaves, then fails as aborted work does.',
    usesDatabase: false,
    response: { status: 200, description: 'Never.' },
    handle: async ({ signal }) => {
      await new Promise((resolve) => signal.addEventListener('abort', resolve));
      throw new Error('aborted');
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/v1/undocumented',
    auth: 'none',
    summary: 'Answers a status it does not declare.',
    response: { status: 200, description: 'Never.' },
    handle: async () => {
      throw new ConflictError('surprise', 'Not declared.');
    },
  }),
];

function appWith(onUndocumentedStatus?: (where: string, status: number) => void, logged: string[] = []) {
  const app = express();
  app.use(express.json());
  app.use(mountRoutes(routes, { guard, onUndocumentedStatus }));
  const logger = { ...createLogWriter({ silent: true }), error: (message: string) => logged.push(message) };
  app.use(errorHandler(logger));
  return app;
}

describe('mountRoutes', () => {
  it('parses the query with its schema (defaults applied) and hands the handler the lab and caller', async () => {
    const res = await request(appWith()).get('/api/v1/labs/seven/items').expect(200);
    expect(res.body).toEqual({ limit: 10, lab: 'seven', callerId: 3 });
  });

  it('answers 400 invalid_input with `Label: reason.` and the refused fields by key, for bad params, query or body alike', async () => {
    const app = appWith();
    const badParam = await request(app).patch('/api/v1/labs/seven/items/x').send({ name: 'ok' }).expect(400);
    // no catalogue names `itemId`, so the key is put in words
    expect(badParam.body.error).toEqual({
      code: 'invalid_input',
      message: 'Item id: must be a number.',
      fields: [{ field: 'itemId', label: 'Item id', reason: 'must be a number' }],
    });
    const badQuery = await request(app).get('/api/v1/labs/seven/items?limit=51').expect(400);
    expect(badQuery.body.error.message).toBe('Limit: must be at most 50.');
    const badBody = await request(app).patch('/api/v1/labs/seven/items/4').send({ name: 'a' }).expect(400);
    expect(badBody.body.error.fields).toEqual([{ field: 'name', label: 'Name', reason: 'must be at least 2 characters' }]);
  });

  it("writes the handler's answer with the declared status; 204 writes no body; typed errors keep theirs", async () => {
    const app = appWith();
    expect((await request(app).patch('/api/v1/labs/seven/items/4').send({ name: 'Shelf' }).expect(200)).body).toEqual({ id: 4, name: 'Shelf' });
    const deleted = await request(app).delete('/api/v1/labs/seven/items/4').expect(204);
    expect(deleted.text).toBe('');
    expect((await request(app).patch('/api/v1/labs/seven/items/4').send({ name: 'taken' }).expect(409)).body.error.code).toBe('name_taken');
  });

  it('lets a streaming route write its own answer', async () => {
    const res = await request(appWith())
      .get('/api/v1/items.csv')
      .expect(200)
      .expect('Content-Type', /text\/csv/);
    expect(res.text).toBe('a,b\n1,2\n');
  });

  it('reports an answer whose status the route does not document, and only that one', async () => {
    const seen: string[] = [];
    const app = appWith((where, status) => seen.push(`${where} ${status}`));
    await request(app).get('/api/v1/undocumented').expect(409);
    await request(app).patch('/api/v1/labs/seven/items/4').send({ name: 'taken' }).expect(409);
    await request(app).get('/api/v1/labs/seven/items?limit=99').expect(400);
    expect(seen).toEqual(['GET /api/v1/undocumented 409']);
  });
});

describe('a client that leaves', () => {
  it('aborts the handler through its signal, and the aborted failure is neither answered nor logged', async () => {
    const logged: string[] = [];
    const server = appWith(undefined, logged).listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    const controller = new AbortController();
    const asked = fetch(`http://127.0.0.1:${port}/api/v1/slow`, { signal: controller.signal }).catch((err: Error) => err.name);
    await new Promise((resolve) => setTimeout(resolve, 100));
    controller.abort();
    expect(await asked).toBe('AbortError');
    await new Promise((resolve) => setTimeout(resolve, 100));
    server.close();
    expect(logged).toEqual([]);
  });
});

describe('answersOf', () => {
  it('adds the standard answers that auth, input and database use imply to the declared ones', () => {
    const [list, rename, , csv] = routes;
    expect([...answersOf(list).keys()]).toEqual([200, 304, 400, 401, 403, 404, 500, 503]);
    expect([...answersOf(rename).keys()]).toEqual([200, 400, 401, 403, 404, 409, 413, 415, 500, 503]);
    expect(answersOf(rename).get(409)).toBe('`name_taken`: another item has the name.');
    expect([...answersOf(csv).keys()]).toEqual([200, 304, 500]);
  });
});

describe('labRouteSummaries', () => {
  it('lists the lab routes with their permission and path below the lab, and nothing else', () => {
    expect(labRouteSummaries(routes).map((r) => `${r.method} ${r.path} ${r.permission}`)).toEqual([
      'get /items lab.read',
      'patch /items/:itemId lab.read',
      'delete /items/:itemId lab.read',
    ]);
  });
});
