import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, buildUser, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, fillPath, rawRequestFor, validBodyFor } from '../support/lab-fixture.ts';
import type { LabRouteSummary } from '../../server/http/routes/route.ts';
import type { Role } from '../../server/policies/permissions.ts';

/**
 * Route × role matrix, generated from the app's own route table: every lab route, for each
 * role plus a signed-out visitor and a signed-in non-member. Who may call what is written
 * out here by hand from the product brief's role table, independently of the server's permission
 * module, so a wrong permission on a route fails this test; a route missing from this table
 * fails it too.
 */
const ALL: Role[] = ['admin', 'technician', 'scientist', 'guest'];
const ALLOWED: Record<string, { roles: Role[]; ok: number }> = {
  'GET ': { roles: ALL, ok: 200 },
  'PATCH ': { roles: ['admin'], ok: 200 },
  'GET /export.zip': { roles: ['admin'], ok: 200 },
  // 202: the fixture lab has no subscription, so an admin's typed name deletes it at once
  'POST /deletion': { roles: ['admin'], ok: 202 },
  'GET /members': { roles: ['admin', 'technician', 'scientist'], ok: 200 },
  'PATCH /members/:userId': { roles: ['admin'], ok: 200 },
  'DELETE /members/:userId': { roles: ['admin'], ok: 204 },
  'DELETE /membership': { roles: ALL, ok: 204 },
  'GET /invitations': { roles: ['admin'], ok: 200 },
  'POST /invitations': { roles: ['admin'], ok: 201 },
  'POST /invitations/:id/resend': { roles: ['admin'], ok: 200 },
  'DELETE /invitations/:id': { roles: ['admin'], ok: 204 },
  'GET /audit': { roles: ['admin'], ok: 200 },
  'GET /overview': { roles: ALL, ok: 200 },
  'GET /alert-rules': { roles: ALL, ok: 200 },
  'POST /alert-rules': { roles: ['admin', 'technician'], ok: 201 },
  'PATCH /alert-rules/:ruleId': { roles: ['admin', 'technician'], ok: 200 },
  'DELETE /alert-rules/:ruleId': { roles: ['admin', 'technician'], ok: 204 },
  'PUT /alert-rules/:ruleId/subscription': { roles: ['admin', 'technician', 'scientist'], ok: 204 },
  'DELETE /alert-rules/:ruleId/subscription': { roles: ['admin', 'technician', 'scientist'], ok: 204 },
  'GET /alerts': { roles: ALL, ok: 200 },
  'POST /alerts/:alertId/acknowledge': { roles: ['admin', 'technician'], ok: 200 },
  'GET /channels/:channelId/notes': { roles: ALL, ok: 200 },
  'GET /loggers/:loggerId/notes': { roles: ALL, ok: 200 },
  'GET /notes': { roles: ALL, ok: 200 },
  'POST /notes': { roles: ['admin', 'technician'], ok: 201 },
  'PATCH /notes/:noteId': { roles: ['admin', 'technician'], ok: 200 },
  'DELETE /notes/:noteId': { roles: ['admin', 'technician'], ok: 204 },
  'GET /note-kinds': { roles: ALL, ok: 200 },
  'POST /note-kinds': { roles: ['admin', 'technician'], ok: 201 },
  'PATCH /note-kinds/:kindId': { roles: ['admin', 'technician'], ok: 200 },
  'GET /channels/:channelId/notes.csv': { roles: ['admin', 'technician', 'scientist'], ok: 200 },
  'GET /notes.csv': { roles: ['admin', 'technician', 'scientist'], ok: 200 },
  'GET /channels/:channelId/alerts': { roles: ALL, ok: 200 },
  'GET /loggers': { roles: ALL, ok: 200 },
  'POST /loggers': { roles: ['admin', 'technician'], ok: 201 },
  'GET /loggers/:loggerId': { roles: ALL, ok: 200 },
  'PATCH /loggers/:loggerId': { roles: ['admin', 'technician'], ok: 200 },
  'POST /loggers/:loggerId/retire': { roles: ['admin', 'technician'], ok: 204 },
  'POST /loggers/:loggerId/channels': { roles: ['admin', 'technician'], ok: 201 },
  'PATCH /loggers/:loggerId/channels/:channelId': { roles: ['admin', 'technician'], ok: 200 },
  'POST /loggers/:loggerId/channels/:channelId/retire': { roles: ['admin', 'technician'], ok: 204 },
  'POST /loggers/:loggerId/keys': { roles: ['admin', 'technician'], ok: 201 },
  'DELETE /loggers/:loggerId/keys/:keyId': { roles: ['admin', 'technician'], ok: 204 },
  'POST /loggers/:loggerId/test-reading': { roles: ['admin', 'technician'], ok: 200 },
  'GET /loggers/:loggerId/test-readings': { roles: ALL, ok: 200 },
  // The fixture's test reading was sent long ago: a permitted caller passes the guard and is told
  // its 10-minute removal window is closed (409); a scientist or guest is refused (403).
  'DELETE /loggers/:loggerId/test-readings/:testReadingId': { roles: ['admin', 'technician'], ok: 409 },
  'GET /channels/:channelId/test-readings': { roles: ALL, ok: 200 },
  'GET /quarantine': { roles: ['admin', 'technician'], ok: 200 },
  'GET /quarantine/export.csv': { roles: ['admin', 'technician'], ok: 200 },
  'POST /quarantine/discard': { roles: ['admin', 'technician'], ok: 200 },
  'POST /quarantine/resubmit': { roles: ['admin', 'technician'], ok: 200 },
  'POST /quarantine/bulk/preview': { roles: ['admin', 'technician'], ok: 200 },
  'POST /quarantine/bulk/runs': { roles: ['admin', 'technician'], ok: 202 },
  'GET /quarantine/bulk/runs': { roles: ['admin', 'technician'], ok: 200 },
  'GET /quarantine/bulk/runs/:runId': { roles: ['admin', 'technician'], ok: 200 },
  'POST /loggers/:loggerId/uploads': { roles: ['admin', 'technician'], ok: 200 },
  'POST /loggers/:loggerId/uploads/time-preview': { roles: ['admin', 'technician'], ok: 200 },
  'GET /channels': { roles: ALL, ok: 200 },
  'GET /channels/:channelId': { roles: ALL, ok: 200 },
  'GET /channels/:channelId/series': { roles: ALL, ok: 200 },
  // The fixture's channel has no readings: a permitted caller passes the guard and gets the
  // engine's refusal (422), the others their 401/403/404.
  'GET /channels/:channelId/diagnostics': { roles: ALL, ok: 422 },
  // Without its ranges a permitted caller passes the guard and gets the validation refusal (400).
  'GET /channels/:channelId/comparison': { roles: ALL, ok: 400 },
  'GET /channels/:channelId/readings.csv': { roles: ['admin', 'technician', 'scientist'], ok: 200 },
  'GET /channels/:channelId/diagnostics.csv': { roles: ['admin', 'technician', 'scientist'], ok: 422 },
  'GET /tokens': { roles: ['admin', 'technician', 'scientist'], ok: 200 },
  'POST /tokens': { roles: ['admin', 'technician', 'scientist'], ok: 201 },
  // The fixture's token is the founder's: a permitted caller passes the guard and is told it
  // has no such token of its own (404, same as a missing one); a guest is refused (403).
  'DELETE /tokens/:tokenId': { roles: ['admin', 'technician', 'scientist'], ok: 404 },
  // Plan and payment are the admins' (the product brief's role table); checkout and portal talk to the Stripe stand-in.
  'GET /billing': { roles: ['admin'], ok: 200 },
  'POST /billing/checkout-session': { roles: ['admin'], ok: 201 },
  // The fixture's lab has no subscription: a permitted caller passes the guard and is told so (409).
  'POST /billing/plan-change': { roles: ['admin'], ok: 409 },
  'POST /billing/portal-session': { roles: ['admin'], ok: 201 },
  'GET /billing/invoices': { roles: ['admin'], ok: 200 },
  'GET /billing/retention': { roles: ['admin'], ok: 200 },
};

type Caller = Role | 'signed-out' | 'non-member';
const CALLERS: Caller[] = ['signed-out', 'non-member', ...ALL];

let t: TestApp;
let routes: LabRouteSummary[];
beforeAll(async () => {
  t = await buildTestApp();
  routes = t.app.locals.labRoutes as LabRouteSummary[];
});
afterAll(async () => t.close());

const key = (r: LabRouteSummary) => `${r.method.toUpperCase()} ${r.path}`;

/** A fresh lab with one of everything, and the caller's cookie. */
async function fixture(caller: Caller) {
  const f = await buildLabWithEverything(t.db);
  let cookie: string | null = null;
  if (caller === 'non-member') cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildUser(t.db)).id);
  else if (caller !== 'signed-out') cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: caller })).id);
  return { f, cookie };
}

describe('lab route table', () => {
  it('every lab route has an entry in this matrix, and every entry is a route', () => {
    expect(routes.map(key).sort()).toEqual(Object.keys(ALLOWED).sort());
  });
});

describe('route × role matrix', () => {
  for (const caller of CALLERS) {
    it(`${caller}: gets exactly the answers the role table says on every lab route`, async () => {
      const mismatches: string[] = [];
      for (const route of routes) {
        const { f, cookie } = await fixture(caller);
        const raw = rawRequestFor(route.method, route.path);
        const path = `/api/v1/labs/${f.lab.slug}${fillPath(route.path, f.params)}${raw?.query ?? ''}`;
        let req = request(t.app)[route.method](path);
        if (cookie) req = req.set('Cookie', cookie);
        const body = validBodyFor(route.method, route.path, f);
        const res = await (raw ? req.set('Content-Type', raw.contentType).send(raw.body) : body ? req.send(body) : req);
        const allowed = ALLOWED[key(route)];
        const expected = caller === 'signed-out' ? 401 : caller === 'non-member' ? 404 : allowed.roles.includes(caller) ? allowed.ok : 403;
        if (res.status !== expected) mismatches.push(`${key(route)} → ${res.status} (expected ${expected}) ${JSON.stringify(res.body)}`);
      }
      expect(mismatches).toEqual([]);
    });
  }
});
