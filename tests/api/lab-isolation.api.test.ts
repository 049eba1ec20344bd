import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor, type TestLab, type TestUser } from '../support/factories.ts';
import type { LabRouteSummary } from '../../server/http/lab-routes.ts';

/**
 * Cross-lab isolation: an admin of lab A (the most powerful role) aims every lab route at
 * lab B — by B's slug, and by A's slug with B's resource ids. Every answer must be a 404
 * that carries none of B's data, and B's rows must be byte-for-byte unchanged afterwards.
 */
let t: TestApp;
let routes: LabRouteSummary[];
let labA: TestLab;
let labB: TestLab;
let adminA: TestUser;
let cookieA: string;
let memberB: TestUser;
let invitationB: number;

async function snapshotOf(lab: TestLab) {
  const [memberships, invitations, audit, labRow] = await Promise.all([
    t.db('memberships').where({ tenant_id: lab.id }).orderBy('user_id'),
    t.db('invitations').where({ tenant_id: lab.id }).orderBy('id'),
    t.db('audit_events').where({ tenant_id: lab.id }).orderBy('id'),
    t.db('labs').where({ id: lab.id }).first(),
  ]);
  return JSON.stringify({ memberships, invitations, audit, labRow });
}

beforeAll(async () => {
  t = await buildTestApp();
  routes = t.app.locals.labRoutes as LabRouteSummary[];
  labA = await buildLab(t.db, { name: 'Lab A' });
  labB = await buildLab(t.db, { name: 'Secret Lab B' });
  adminA = await buildMember(t.db, labA, { role: 'admin' });
  await buildMember(t.db, labB, { role: 'admin', email: `b-admin-${labB.id}@b.example`, displayName: 'B Admin Person' });
  memberB = await buildMember(t.db, labB, { role: 'scientist', email: `b-sci-${labB.id}@b.example`, displayName: 'B Scientist Person' });
  invitationB = 7_000_000 + labB.id;
  await t.db('invitations').insert({ tenant_id: labB.id, id: invitationB, email: `b-invitee-${labB.id}@b.example`, role: 'guest', token_hash: 'b'.repeat(64), expires_at: new Date(Date.now() + 86400_000) });
  await t.db('audit_events').insert({ tenant_id: labB.id, id: 9_000_000 + labB.id, action: 'lab.created', summary: 'B private audit line' });
  cookieA = await sessionCookieFor(t.db, t.config.sessionSecret, adminA.id);
});
afterAll(async () => t.close());

function expectNoTraceOfB(text: string) {
  for (const secret of ['Secret Lab B', 'B Admin Person', 'B Scientist Person', `b-invitee-${labB.id}`, 'B private audit line', `b-sci-${labB.id}`]) {
    expect(text).not.toContain(secret);
  }
}

function send(route: LabRouteSummary, slug: string, userId: number, invitationId: number) {
  const path = `/api/v1/labs/${slug}${route.path}`.replace(':userId', String(userId)).replace(':id', String(invitationId));
  const body = route.method === 'patch' ? { role: 'admin' } : route.method === 'post' && route.path === '/invitations' ? { email: 'intruder@a.example', role: 'admin' } : undefined;
  const req = request(t.app)[route.method](path).set('Cookie', cookieA);
  return body ? req.send(body) : req;
}

describe('cross-lab isolation', () => {
  it("lab A's admin gets 404 and no data on every route aimed at lab B's slug, and B is unchanged", async () => {
    const before = await snapshotOf(labB);
    for (const route of routes) {
      const res = await send(route, labB.slug, memberB.id, invitationB);
      expect(res.status, `${route.method} ${route.path}`).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expectNoTraceOfB(res.text);
    }
    expect(await snapshotOf(labB)).toBe(before);
  });

  it("lab A's admin using lab A's slug with lab B's member and invitation ids gets 404 and changes nothing in B", async () => {
    const before = await snapshotOf(labB);
    const idRoutes = routes.filter((r) => r.path.includes(':'));
    expect(idRoutes.length).toBeGreaterThan(0);
    for (const route of idRoutes) {
      const res = await send(route, labA.slug, memberB.id, invitationB);
      expect(res.status, `${route.method} ${route.path}`).toBe(404);
      expectNoTraceOfB(res.text);
    }
    expect(await snapshotOf(labB)).toBe(before);
  });

  it("list routes in lab A never include lab B's rows", async () => {
    for (const path of ['/members', '/invitations', '/audit']) {
      const res = await request(t.app).get(`/api/v1/labs/${labA.slug}${path}`).set('Cookie', cookieA).expect(200);
      expectNoTraceOfB(res.text);
    }
  });

  it('a lab that does not exist and a lab one is not in give the same answer', async () => {
    const missing = await request(t.app).get('/api/v1/labs/no-such-lab-anywhere').set('Cookie', cookieA);
    const foreign = await request(t.app).get(`/api/v1/labs/${labB.slug}`).set('Cookie', cookieA);
    expect(missing.status).toBe(404);
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
  });

  it("/api/v1/me lists only the person's own labs", async () => {
    const res = await request(t.app).get('/api/v1/me').set('Cookie', cookieA).expect(200);
    expect(res.body.labs.map((l: { slug: string }) => l.slug)).toEqual([labA.slug]);
  });
});
