import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, type TestUser } from '../support/factories.ts';
import { buildLabWithEverything, fillPath, rawRequestFor, validBodyFor, type LabWithEverything } from '../support/lab-fixture.ts';
import type { LabRouteSummary } from '../../server/http/routes/route.ts';
import { LAB_OWNED_TABLES } from '../../server/db/tenant-scope.ts';

/**
 * Cross-lab isolation: an admin of lab A (the most powerful role) aims every lab route at
 * lab B — by B's slug, and by A's slug with B's resource ids — and A's logger key posts
 * readings with B's channel keys. Every answer must be a 404 (or a quarantine in A) that
 * carries none of B's data, and B's rows must be byte-for-byte unchanged afterwards.
 */
let t: TestApp;
let routes: LabRouteSummary[];
let A: LabWithEverything;
let B: LabWithEverything;
let adminA: TestUser;
let cookieA: string;

async function snapshotOf(f: LabWithEverything) {
  const tables = await Promise.all(LAB_OWNED_TABLES.map((name) => t.db(name).where({ tenant_id: f.lab.id }).orderByRaw('1, 2')));
  return JSON.stringify({ tables, lab: await t.db('labs').where({ id: f.lab.id }).first() });
}

beforeAll(async () => {
  t = await buildTestApp();
  routes = t.app.locals.labRoutes as LabRouteSummary[];
  A = await buildLabWithEverything(t.db, { name: 'Lab A' });
  B = await buildLabWithEverything(t.db, { name: 'Secret Lab B', rowInEveryTable: true });
  // every table of the byte-for-byte comparison holds something of B's to compare
  for (const name of LAB_OWNED_TABLES) if (!(await t.db(name).where({ tenant_id: B.lab.id }).first())) throw new Error(`set-up: lab B has no row in ${name}`);
  adminA = await buildMember(t.db, A.lab, { role: 'admin' });
  await buildMember(t.db, B.lab, { role: 'scientist', email: `b-sci-${B.lab.id}@b.example`, displayName: 'B Scientist Person' });
  await t.db('loggers').where({ tenant_id: B.lab.id }).update({ name: 'B hidden logger' });
  cookieA = await sessionCookieFor(t.db, t.config.sessionSecret, adminA.id);
});
afterAll(async () => t.close());

function expectNoTraceOfB(text: string) {
  for (const secret of ['Secret Lab B', 'B Scientist Person', `b-sci-${B.lab.id}`, 'B hidden logger', B.lab.slug]) {
    expect(text).not.toContain(secret);
  }
}

function send(route: LabRouteSummary, slug: string, params: Record<string, number>) {
  const raw = rawRequestFor(route.method, route.path);
  const path = `/api/v1/labs/${slug}${fillPath(route.path, params)}${raw?.query ?? ''}`;
  const body = validBodyFor(route.method, route.path, B);
  const req = request(t.app)[route.method](path).set('Cookie', cookieA);
  return raw ? req.set('Content-Type', raw.contentType).send(raw.body) : body ? req.send(body) : req;
}

describe('cross-lab isolation', () => {
  it("lab A's admin gets 404 and no data on every route aimed at lab B's slug, and B is unchanged", async () => {
    const before = await snapshotOf(B);
    for (const route of routes) {
      const res = await send(route, B.lab.slug, B.params);
      expect(res.status, `${route.method} ${route.path}`).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expectNoTraceOfB(res.text);
    }
    expect(await snapshotOf(B)).toBe(before);
  });

  it("lab A's admin using lab A's slug with lab B's resource ids gets 404 and changes nothing in B", async () => {
    const before = await snapshotOf(B);
    const idRoutes = routes.filter((r) => r.path.includes(':') || (r.method === 'post' && r.path.startsWith('/quarantine/')));
    expect(idRoutes.length).toBeGreaterThan(5);
    for (const route of idRoutes) {
      const res = await send(route, A.lab.slug, B.params);
      expect(res.status, `${route.method} ${route.path}`).toBe(404);
      expectNoTraceOfB(res.text);
    }
    expect(await snapshotOf(B)).toBe(before);
  });

  it("list routes in lab A never include lab B's rows", async () => {
    for (const path of ['/members', '/invitations', '/audit', '/loggers', '/quarantine', '/quarantine/export.csv']) {
      const res = await request(t.app).get(`/api/v1/labs/${A.lab.slug}${path}`).set('Cookie', cookieA).expect(200);
      expectNoTraceOfB(res.text);
    }
  });

  it("lab A's ingest key cannot write into lab B, even with B's channel keys: the rows are quarantined in A", async () => {
    await t.db('channels').where({ tenant_id: B.lab.id }).update({ channel_key: 'b_only_key' });
    const before = await snapshotOf(B);
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${A.ingestKey}`)
      .send({ readings: [{ channel: 'b_only_key', ts: '2026-01-01T00:00:00Z', value: 1 }] })
      .expect(200);
    expect(res.body).toEqual({
      accepted: 0,
      duplicates: 0,
      quarantined: [{ index: 0, code: 'unknown_channel', reason: 'channel: no channel "b_only_key" on this logger' }],
    });
    expect(await snapshotOf(B)).toBe(before);
    expect(await t.db('quarantined_rows').where({ tenant_id: A.lab.id, channel_key: 'b_only_key' })).toHaveLength(1);
  });

  it('a lab that does not exist and a lab one is not in give the same answer', async () => {
    const missing = await request(t.app).get('/api/v1/labs/no-such-lab-anywhere').set('Cookie', cookieA);
    const foreign = await request(t.app).get(`/api/v1/labs/${B.lab.slug}`).set('Cookie', cookieA);
    expect(missing.status).toBe(404);
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
  });

  it("/api/v1/me lists only the person's own labs", async () => {
    const res = await request(t.app).get('/api/v1/me').set('Cookie', cookieA).expect(200);
    expect(res.body.labs.map((l: { slug: string }) => l.slug)).toEqual([A.lab.slug]);
  });
});
