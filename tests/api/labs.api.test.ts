import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, buildUser, sessionCookieFor } from '../support/factories.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

describe('POST /api/v1/labs', () => {
  it('creates a lab from a name, makes the creator its admin and records it in the audit log', async () => {
    const user = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    const name = `Ridge Ecology Unit ${Date.now()}`;
    const res = await request(t.app).post('/api/v1/labs').set('Cookie', cookie).send({ name }).expect(201);
    expect(res.body.lab).toEqual({ slug: `ridge-ecology-unit-${name.split(' ').pop()}`, name, role: 'admin' });
    const lab = await request(t.app).get(`/api/v1/labs/${res.body.lab.slug}`).set('Cookie', cookie).expect(200);
    expect(lab.body.role).toBe('admin');
    expect(lab.body.permissions).toContain('members.manage');
    const me = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(me.body.labs).toEqual([{ slug: res.body.lab.slug, name, role: 'admin' }]);
    const audit = await request(t.app).get(`/api/v1/labs/${res.body.lab.slug}/audit`).set('Cookie', cookie).expect(200);
    expect(audit.body.entries.map((e: { action: string }) => e.action)).toEqual(['lab.created']);
  });

  it("keeps the person's own time zone: set, shown by GET /me, refused when unknown, cleared with null", async () => {
    const user = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    expect((await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200)).body.user.timeZone).toBeNull();
    const set = await request(t.app).patch('/api/v1/me').set('Cookie', cookie).send({ timeZone: ' America/New_York ' }).expect(200);
    expect(set.body.user.timeZone).toBe('America/New_York');
    expect((await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200)).body.user.timeZone).toBe('America/New_York');
    const bad = await request(t.app).patch('/api/v1/me').set('Cookie', cookie).send({ timeZone: 'Mars/Olympus_Mons' }).expect(400);
    expect(bad.body.error.message).toBe('Your time zone: must be a time zone such as Europe/Berlin or UTC.');
    expect((await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200)).body.user.timeZone).toBe('America/New_York');
    expect((await request(t.app).patch('/api/v1/me').set('Cookie', cookie).send({ timeZone: null }).expect(200)).body.user.timeZone).toBeNull();
    await request(t.app).patch('/api/v1/me').send({ timeZone: 'UTC' }).expect(401);
  });

  it('answers 401 when signed out', async () => {
    await request(t.app).post('/api/v1/labs').send({ name: 'Nope' }).expect(401);
  });

  it.each([
    [{}, 'Lab name: is required.'],
    [{ name: 'x' }, 'Lab name: must be at least 2 characters.'],
    [{ name: 'Good name', slug: 'Bad Slug' }, 'Web address: use lowercase letters, digits and single hyphens.'],
    [{ name: '!!' }, 'Web address: choose an address of at least 3 letters or digits.'],
  ])('refuses %j with 400 and the exact message', async (body, message) => {
    const user = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    const res = await request(t.app).post('/api/v1/labs').set('Cookie', cookie).send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
  });

  it('gives a lab at a taken address the next free variant instead of refusing (no existence oracle; see lab-oracle.api.test.ts)', async () => {
    const existing = await buildLab(t.db);
    const user = await buildUser(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, user.id);
    const res = await request(t.app).post('/api/v1/labs').set('Cookie', cookie).send({ name: 'Another', slug: existing.slug }).expect(201);
    expect(res.body).toEqual({ lab: { slug: `${existing.slug}-2`, name: 'Another', role: 'admin' }, requestedSlug: existing.slug });
    const mine = await t.db('memberships').join('labs', 'labs.id', 'memberships.tenant_id').where({ user_id: user.id }).select('labs.slug', 'memberships.role');
    expect(mine).toEqual([{ slug: `${existing.slug}-2`, role: 'admin' }]);
    expect(await t.db('memberships').where({ tenant_id: existing.id })).toEqual([]);
  });
});

describe('members', () => {
  async function labWith(...roles: Array<'admin' | 'technician' | 'scientist' | 'guest'>) {
    const lab = await buildLab(t.db);
    const people = [];
    for (const role of roles) people.push(await buildMember(t.db, lab, { role }));
    const cookies = await Promise.all(people.map((p) => sessionCookieFor(t.db, t.config.sessionSecret, p.id)));
    return { lab, people, cookies };
  }

  it('lists members with role and join date; admins change roles (audit-logged)', async () => {
    const { lab, people, cookies } = await labWith('admin', 'scientist');
    const list = await request(t.app).get(`/api/v1/labs/${lab.slug}/members`).set('Cookie', cookies[1]).expect(200);
    expect(list.body.members).toHaveLength(2);
    expect(list.body.members[0]).toEqual(
      expect.objectContaining({ userId: expect.any(Number), email: expect.any(String), role: expect.any(String), joinedAt: expect.any(String) }),
    );
    const changed = await request(t.app)
      .patch(`/api/v1/labs/${lab.slug}/members/${people[1].id}`)
      .set('Cookie', cookies[0])
      .send({ role: 'technician' })
      .expect(200);
    expect(changed.body.member.role).toBe('technician');
    const audit = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?action=member.role-changed`).set('Cookie', cookies[0]).expect(200);
    expect(audit.body.entries[0].details).toEqual({ email: people[1].email, from: 'scientist', to: 'technician' });
  });

  it('refuses an unknown role with the exact message', async () => {
    const { lab, people, cookies } = await labWith('admin', 'scientist');
    const res = await request(t.app).patch(`/api/v1/labs/${lab.slug}/members/${people[1].id}`).set('Cookie', cookies[0]).send({ role: 'owner' }).expect(400);
    expect(res.body.error.message).toBe('Role: must be one of admin, technician, scientist, guest.');
    const bad = await request(t.app).patch(`/api/v1/labs/${lab.slug}/members/abc`).set('Cookie', cookies[0]).send({ role: 'guest' }).expect(400);
    expect(bad.body.error.message).toMatch(/^Member: /);
  });

  it('the last admin can be neither demoted, removed, nor leave', async () => {
    const { lab, people, cookies } = await labWith('admin', 'scientist');
    const demote = await request(t.app).patch(`/api/v1/labs/${lab.slug}/members/${people[0].id}`).set('Cookie', cookies[0]).send({ role: 'guest' }).expect(409);
    expect(demote.body.error).toEqual({
      code: 'last_admin',
      message: 'A lab needs at least one admin: make someone else admin first, or delete the lab under Lab settings if it is no longer needed.',
    });
    await request(t.app).delete(`/api/v1/labs/${lab.slug}/members/${people[0].id}`).set('Cookie', cookies[0]).expect(409);
    await request(t.app).delete(`/api/v1/labs/${lab.slug}/membership`).set('Cookie', cookies[0]).expect(409);
    const roles = await t.db('memberships').where({ tenant_id: lab.id }).orderBy('user_id').pluck('role');
    expect(roles).toEqual(['admin', 'scientist']);
  });

  it('two admins demoting each other at once leave exactly one admin', async () => {
    const { lab, people, cookies } = await labWith('admin', 'admin');
    const [a, b] = await Promise.all([
      request(t.app).patch(`/api/v1/labs/${lab.slug}/members/${people[1].id}`).set('Cookie', cookies[0]).send({ role: 'guest' }),
      request(t.app).patch(`/api/v1/labs/${lab.slug}/members/${people[0].id}`).set('Cookie', cookies[1]).send({ role: 'guest' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const admins = await t.db('memberships').where({ tenant_id: lab.id, role: 'admin' });
    expect(admins).toHaveLength(1);
  });

  it('a removed member loses access on their next request', async () => {
    const { lab, people, cookies } = await labWith('admin', 'scientist');
    await request(t.app).get(`/api/v1/labs/${lab.slug}/members`).set('Cookie', cookies[1]).expect(200);
    await request(t.app).delete(`/api/v1/labs/${lab.slug}/members/${people[1].id}`).set('Cookie', cookies[0]).expect(204);
    await request(t.app).get(`/api/v1/labs/${lab.slug}/members`).set('Cookie', cookies[1]).expect(404);
    const audit = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?action=member.removed`).set('Cookie', cookies[0]).expect(200);
    expect(audit.body.total).toBe(1);
  });

  it('a member may leave; the audit log says they left', async () => {
    const { lab, cookies } = await labWith('admin', 'guest');
    await request(t.app).delete(`/api/v1/labs/${lab.slug}/membership`).set('Cookie', cookies[1]).expect(204);
    const audit = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?action=member.left`).set('Cookie', cookies[0]).expect(200);
    expect(audit.body.total).toBe(1);
  });
});

describe('audit log', () => {
  it('pages newest first and filters by action, actor and time', async () => {
    const lab = await buildLab(t.db);
    const admin = await buildMember(t.db, lab, { role: 'admin', displayName: 'Quill Auditor' });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, admin.id);
    const base = Date.parse('2026-03-01T00:00:00Z');
    for (let i = 0; i < 7; i++) {
      await t.db('audit_events').insert({
        tenant_id: lab.id,
        id: 5_000_000 + lab.id * 10 + i,
        at: new Date(base + i * 3600_000),
        actor_user_id: i % 2 ? admin.id : null,
        action: i < 4 ? 'member.removed' : 'invitation.created',
        summary: `event ${i}`,
      });
    }
    const page1 = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?pageSize=3`).set('Cookie', cookie).expect(200);
    expect(page1.body.total).toBe(7);
    expect(page1.body.entries.map((e: { summary: string }) => e.summary)).toEqual(['event 6', 'event 5', 'event 4']);
    const page3 = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?pageSize=3&page=3`).set('Cookie', cookie).expect(200);
    expect(page3.body.entries.map((e: { summary: string }) => e.summary)).toEqual(['event 0']);
    const byAction = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?action=invitation.created`).set('Cookie', cookie).expect(200);
    expect(byAction.body.total).toBe(3);
    const byActor = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?actor=quill`).set('Cookie', cookie).expect(200);
    expect(byActor.body.entries.map((e: { summary: string }) => e.summary)).toEqual(['event 5', 'event 3', 'event 1']);
    expect(byActor.body.entries[0].actor).toEqual({ name: 'Quill Auditor', email: admin.email });
    const byTime = await request(t.app)
      .get(`/api/v1/labs/${lab.slug}/audit?from=${encodeURIComponent('2026-03-01T01:00:00Z')}&to=${encodeURIComponent('2026-03-01T02:00:00Z')}`)
      .set('Cookie', cookie)
      .expect(200);
    expect(byTime.body.entries.map((e: { summary: string }) => e.summary)).toEqual(['event 2', 'event 1']);
    const bad = await request(t.app).get(`/api/v1/labs/${lab.slug}/audit?pageSize=500`).set('Cookie', cookie).expect(400);
    expect(bad.body.error.message).toBe('Entries per page: must be at most 200.');
  });
});
