import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, type TestUser } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { hashPersonalToken } from '../../server/services/personal-token-format.ts';

/**
 * Personal API tokens: made, listed and revoked by their owner; shown once and stored hashed;
 * accepted as `Authorization: Bearer lbt_…` on the read routes of their own lab only, with the
 * owner's current role, and refused everywhere else.
 */
let t: TestApp;
let A: LabWithEverything;
let B: LabWithEverything;
let scientist: TestUser;
let cookie: string;

beforeAll(async () => {
  t = await buildTestApp();
  A = await buildLabWithEverything(t.db, { name: 'Token Lab A' });
  B = await buildLabWithEverything(t.db, { name: 'Token Lab B' });
  scientist = await buildMember(t.db, A.lab, { role: 'scientist' });
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, scientist.id);
});
afterAll(async () => t.close());

const labPath = (f: LabWithEverything, path = '') => `/api/v1/labs/${f.lab.slug}${path}`;
const bearer = (token: string) => `Bearer ${token}`;

/** Makes a token as `who` in lab A through the API and returns the answer body. */
async function makeToken(who = cookie, body: object = { name: 'Soil notebook', expiresInDays: 30 }) {
  const res = await request(t.app).post(labPath(A, '/tokens')).set('Cookie', who).send(body).expect(201);
  return res.body as { token: string; tokenInfo: { id: number; prefix: string; name: string; expiresAt: string }; shownOnce: boolean };
}

describe('managing personal tokens', () => {
  it('makes a token shown once, stored only as its SHA-256, listed without its secret, audit-logged', async () => {
    const before = Date.now();
    const made = await makeToken();
    expect(made.token).toMatch(/^lbt_[0-9a-f]{12}_[A-Za-z0-9_-]{43}$/);
    expect(made.shownOnce).toBe(true);
    expect(made.tokenInfo.prefix).toBe(made.token.slice(4, 16));
    // 30 days after creation (within the test's own run time).
    const expires = Date.parse(made.tokenInfo.expiresAt);
    expect(expires).toBeGreaterThanOrEqual(before + 30 * 86_400_000 - 1000);
    expect(expires).toBeLessThanOrEqual(Date.now() + 30 * 86_400_000 + 1000);

    const row = await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: made.tokenInfo.id }).first();
    expect(row.token_hash).toBe(hashPersonalToken(made.token));
    expect(JSON.stringify(row)).not.toContain(made.token.slice(17));

    const list = await request(t.app).get(labPath(A, '/tokens')).set('Cookie', cookie).expect(200);
    expect(JSON.stringify(list.body)).not.toContain(made.token.slice(17));
    expect(list.body.tokens).toContainEqual(
      expect.objectContaining({ id: made.tokenInfo.id, name: 'Soil notebook', prefix: made.tokenInfo.prefix, lastUsedAt: null, revokedAt: null }),
    );

    const audit = await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'token.created', target_id: String(made.tokenInfo.id) });
    expect(audit).toHaveLength(1);
    expect(audit[0].actor_user_id).toBe(scientist.id);
  });

  it("lists only the signed-in person's own tokens, not the founder's", async () => {
    const list = await request(t.app).get(labPath(A, '/tokens')).set('Cookie', cookie).expect(200);
    expect(list.body.tokens.map((x: { id: number }) => x.id)).not.toContain(A.ids.tokenId);
    expect(list.body.tokens.length).toBeGreaterThan(0);
  });

  it('refuses bad input in plain words, the field by key', async () => {
    const cases: [object, string][] = [
      [{ name: '', expiresInDays: 30 }, 'Token name: must not be empty.'],
      [{ name: 'x'.repeat(81), expiresInDays: 30 }, 'Token name: must be at most 80 characters.'],
      [{ name: 'ok', expiresInDays: 0 }, 'Valid for (days): must be at least 1 day.'],
      [{ name: 'ok', expiresInDays: 366 }, 'Valid for (days): must be at most 365 days.'],
      [{ name: 'ok', expiresInDays: 1.5 }, 'Valid for (days): must be a whole number.'],
    ];
    for (const [body, message] of cases) {
      const res = await request(t.app).post(labPath(A, '/tokens')).set('Cookie', cookie).send(body).expect(400);
      expect(res.body.error).toEqual(expect.objectContaining({ code: 'invalid_input', message }));
    }
  });

  it("revokes one's own token (audit-logged); someone else's token answers 404 and keeps working", async () => {
    const made = await makeToken();
    await request(t.app)
      .delete(labPath(A, `/tokens/${made.tokenInfo.id}`))
      .set('Cookie', cookie)
      .expect(204);
    const row = await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: made.tokenInfo.id }).first();
    expect(row.revoked_at).not.toBeNull();
    expect(await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'token.revoked', target_id: String(made.tokenInfo.id) })).toHaveLength(1);

    const res = await request(t.app)
      .delete(labPath(A, `/tokens/${A.ids.tokenId}`))
      .set('Cookie', cookie)
      .expect(404);
    expect(res.body.error.code).toBe('not_found');
    await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(A.personalToken)).expect(200);
  });

  it('guests cannot make tokens (403)', async () => {
    const guestCookie = await sessionCookieFor(t.db, t.config.sessionSecret, A.guest.id);
    const res = await request(t.app).post(labPath(A, '/tokens')).set('Cookie', guestCookie).send({ name: 'nope', expiresInDays: 5 }).expect(403);
    expect(res.body.error.code).toBe('forbidden');
  });
});

describe('reading with a personal token', () => {
  it('works on the read routes of its lab with no cookie, and records its last use', async () => {
    const { token, tokenInfo } = await makeToken();
    const channels = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(token)).expect(200);
    expect(channels.body.channels.map((c: { id: number }) => c.id)).toContain(A.ids.channelId);
    const loggers = await request(t.app).get(labPath(A, '/loggers')).set('Authorization', bearer(token)).expect(200);
    expect(loggers.body.loggers.map((l: { id: number }) => l.id)).toContain(A.ids.loggerId);
    await request(t.app)
      .get(labPath(A, `/channels/${A.ids.channelId}/series`))
      .set('Authorization', bearer(token))
      .expect(200);
    const csv = await request(t.app)
      .get(labPath(A, `/channels/${A.ids.channelId}/readings.csv`))
      .set('Authorization', bearer(token))
      .expect(200);
    expect(csv.text.startsWith('time_utc,epoch_ms,value')).toBe(true);
    const lab = await request(t.app).get(labPath(A)).set('Authorization', bearer(token)).expect(200);
    expect(lab.body.role).toBe('scientist');

    const used = await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: tokenInfo.id }).first();
    expect(used.last_used_at).not.toBeNull();
  });

  it('writes last_used_at at most once a minute', async () => {
    const { token, tokenInfo } = await makeToken();
    await request(t.app).get(labPath(A, '/loggers')).set('Authorization', bearer(token)).expect(200);
    const marked = new Date(Date.now() - 30_000);
    await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: tokenInfo.id }).update({ last_used_at: marked });
    await request(t.app).get(labPath(A, '/loggers')).set('Authorization', bearer(token)).expect(200);
    const still = await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: tokenInfo.id }).first();
    expect(still.last_used_at.getTime()).toBe(marked.getTime());
    await t
      .db('personal_tokens')
      .where({ tenant_id: A.lab.id, id: tokenInfo.id })
      .update({ last_used_at: new Date(Date.now() - 61_000) });
    await request(t.app).get(labPath(A, '/loggers')).set('Authorization', bearer(token)).expect(200);
    const moved = await t.db('personal_tokens').where({ tenant_id: A.lab.id, id: tokenInfo.id }).first();
    expect(Date.now() - moved.last_used_at.getTime()).toBeLessThan(10_000);
  });

  it('is refused on every write and on reads outside the read permissions (403 token_not_allowed), changing nothing', async () => {
    const { token } = await makeToken();
    const attempts = [
      request(t.app).post(labPath(A, '/loggers')).send({ name: 'Sneaky', timezone: 'UTC', expectedIntervalS: 60, channels: [] }),
      request(t.app)
        .patch(labPath(A, `/loggers/${A.ids.loggerId}`))
        .send({ site: 'Elsewhere' }),
      request(t.app).post(labPath(A, '/tokens')).send({ name: 'minted by a token', expiresInDays: 5 }),
      request(t.app).delete(labPath(A, '/membership')),
      request(t.app).get(labPath(A, '/tokens')),
      request(t.app).get(labPath(A, '/members')),
    ];
    for (const attempt of attempts) {
      const res = await attempt.set('Authorization', bearer(token));
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'token_not_allowed', message: 'Personal tokens can only read.' });
    }
    expect(await t.db('loggers').where({ tenant_id: A.lab.id, name: 'Sneaky' })).toHaveLength(0);
    expect(await t.db('memberships').where({ tenant_id: A.lab.id, user_id: scientist.id })).toHaveLength(1);
  });

  it('does not sign anyone in on /api/v1/me or sign-out (401)', async () => {
    const { token } = await makeToken();
    const me = await request(t.app).get('/api/v1/me').set('Authorization', bearer(token));
    expect(me.status).toBe(401);
    const labs = await request(t.app).post('/api/v1/labs').set('Authorization', bearer(token)).send({ name: 'Token-made lab' });
    expect(labs.status).toBe(401);
  });

  it("answers 404 on another lab's URL — even one its owner belongs to — the same as for a lab that does not exist", async () => {
    const both = await buildMember(t.db, A.lab, { role: 'scientist' });
    await t.db('memberships').insert({ tenant_id: B.lab.id, user_id: both.id, role: 'admin' });
    const { token } = await makeToken(await sessionCookieFor(t.db, t.config.sessionSecret, both.id));
    await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(token)).expect(200);
    const foreign = await request(t.app).get(labPath(B, '/channels')).set('Authorization', bearer(token));
    const missing = await request(t.app).get('/api/v1/labs/no-such-lab-for-tokens/channels').set('Authorization', bearer(token));
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
    expect(foreign.text).not.toContain('Token Lab B');
  });

  it('stops working when expired or revoked (401 invalid_token), and a forged secret never works', async () => {
    const expired = await makeToken();
    await t
      .db('personal_tokens')
      .where({ tenant_id: A.lab.id, id: expired.tokenInfo.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const e = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(expired.token)).expect(401);
    expect(e.body.error).toEqual({ code: 'invalid_token', message: 'This personal token has expired.' });

    const revoked = await makeToken();
    await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(revoked.token)).expect(200);
    await request(t.app)
      .delete(labPath(A, `/tokens/${revoked.tokenInfo.id}`))
      .set('Cookie', cookie)
      .expect(204);
    const r = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(revoked.token)).expect(401);
    expect(r.body.error).toEqual({ code: 'invalid_token', message: 'This personal token has been revoked.' });

    const live = await makeToken();
    const last = live.token.at(-1) === 'A' ? 'B' : 'A';
    const forged = `${live.token.slice(0, -1)}${last}`;
    const f = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(forged)).expect(401);
    expect(f.body.error.code).toBe('invalid_token');
    const garbled = await request(t.app).get(labPath(A, '/channels')).set('Authorization', 'Bearer lbt_not-a-token').expect(401);
    expect(garbled.body.error.code).toBe('invalid_token');
  });

  it("follows its owner's membership: removed → 404; demoted to guest → reads what guests read", async () => {
    const owner = await buildMember(t.db, A.lab, { role: 'scientist' });
    const ownerCookie = await sessionCookieFor(t.db, t.config.sessionSecret, owner.id);
    const { token } = await makeToken(ownerCookie);
    await request(t.app)
      .get(labPath(A, `/channels/${A.ids.channelId}/readings.csv`))
      .set('Authorization', bearer(token))
      .expect(200);

    await t.db('memberships').where({ tenant_id: A.lab.id, user_id: owner.id }).update({ role: 'guest' });
    await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(token)).expect(200);
    const lab = await request(t.app).get(labPath(A)).set('Authorization', bearer(token)).expect(200);
    expect(lab.body.role).toBe('guest');
    // Exports are for scientists and above: the demoted owner's token loses them at once.
    const exp = await request(t.app)
      .get(labPath(A, `/channels/${A.ids.channelId}/readings.csv`))
      .set('Authorization', bearer(token))
      .expect(403);
    expect(exp.body.error.code).toBe('forbidden');

    await t.db('memberships').where({ tenant_id: A.lab.id, user_id: owner.id }).delete();
    const gone = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(token)).expect(404);
    expect(gone.body.error.code).toBe('not_found');
  });

  it('a signed-in session is unaffected by a token header, and an ingest key is no personal token', async () => {
    const asSession = await request(t.app).get(labPath(A, '/tokens')).set('Cookie', cookie).set('Authorization', 'Bearer lbt_whatever').expect(200);
    expect(Array.isArray(asSession.body.tokens)).toBe(true);
    const ingestKey = await request(t.app).get(labPath(A, '/channels')).set('Authorization', bearer(A.ingestKey)).expect(401);
    expect(ingestKey.body.error.code).toBe('unauthenticated');
  });
});
