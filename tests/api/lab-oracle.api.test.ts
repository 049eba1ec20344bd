/**
 * No existence oracle for labs (#15 finding 8), on the real MariaDB:
 * - creating a lab at an address another lab uses answers exactly like creating one at a free
 *   address (status, headers, body shape, and the same database statements), except for the
 *   address the new lab got (a "-2"-style variant);
 * - the lab guard runs the same statements for a lab that is someone else's as for one that
 *   does not exist. The checks count and compare the SQL the app sends (the code path), never
 *   the time it takes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildUser, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything } from '../support/lab-fixture.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

/** Runs `fn` and returns what it resolved to with the SQL of every statement the app sent meanwhile. */
async function statementsOf<T>(fn: () => Promise<T>): Promise<{ result: T; sql: string[] }> {
  const sql: string[] = [];
  const onQuery = (q: { sql: string }) => sql.push(q.sql);
  t.db.on('query', onQuery);
  try {
    return { result: await fn(), sql };
  } finally {
    t.db.removeListener('query', onQuery);
  }
}

const newPerson = async () => sessionCookieFor(t.db, t.config.sessionSecret, (await buildUser(t.db)).id);
const unique = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`;

describe('POST /api/v1/labs at an address another lab uses', () => {
  it('answers like a fresh address (201, same headers, same shape and statements), only with a variant address', async () => {
    const word = `oracle-${unique()}`;
    const other = await buildLab(t.db, { slug: `${word}-taken` });
    const create = async (slug: string) => {
      const cookie = await newPerson();
      return statementsOf(() => request(t.app).post('/api/v1/labs').set('Cookie', cookie).send({ name: 'Heathland Soil Group', slug }));
    };
    const fresh = await create(`${word}-fresh`);
    const taken = await create(other.slug);

    expect(fresh.result.status).toBe(201);
    expect(taken.result.status).toBe(201);
    expect(fresh.result.body).toEqual({ lab: { slug: `${word}-fresh`, name: 'Heathland Soil Group', role: 'admin' }, requestedSlug: `${word}-fresh` });
    expect(taken.result.body).toEqual({ lab: { slug: `${word}-taken-2`, name: 'Heathland Soil Group', role: 'admin' }, requestedSlug: `${word}-taken` });
    // Beyond the address itself, nothing differs: header names, body shape, the statements sent.
    const headerNames = (h: Record<string, string>) =>
      Object.keys(h)
        .filter((k) => k !== 'date')
        .sort();
    expect(headerNames(taken.result.headers)).toEqual(headerNames(fresh.result.headers));
    // 'taken' and 'fresh' have the same length: the bodies differ by the variant's "-2" alone.
    expect(Number(taken.result.headers['content-length'])).toBe(Number(fresh.result.headers['content-length']) + '-2'.length);
    expect(taken.sql).toEqual(fresh.sql);
    // The other lab is untouched and the new one is the creator's.
    expect(await t.db('labs').where({ id: other.id }).first('name')).toEqual({ name: other.name });
  });

  it('is documented: the 201 answer with requestedSlug and the 403 of the lab cap', async () => {
    const op = (await request(t.app).get('/api/v1/openapi.json').expect(200)).body.paths['/api/v1/labs'].post;
    expect(op.responses['201'].description).toContain('requestedSlug');
    expect(op.responses['201'].description).toContain('never says whether another lab uses an address');
    expect(op.responses['403'].description).toMatch(/^`lab_limit_reached`: /);
  });

  it('takes the first free variant, also for an address derived from the name', async () => {
    const word = `ridge-${unique()}`;
    await buildLab(t.db, { slug: word });
    await buildLab(t.db, { slug: `${word}-2` });
    const res = await request(t.app)
      .post('/api/v1/labs')
      .set('Cookie', await newPerson())
      .send({ name: word.replace('-', ' ') })
      .expect(201);
    expect(res.body).toEqual({ lab: { slug: `${word}-3`, name: word.replace('-', ' '), role: 'admin' }, requestedSlug: word });
  });

  it('cuts a 48-character address to fit its suffix', async () => {
    const word = `a${unique()}`.padEnd(48, 'x');
    await buildLab(t.db, { slug: word });
    const res = await request(t.app)
      .post('/api/v1/labs')
      .set('Cookie', await newPerson())
      .send({ name: 'Long address lab', slug: word })
      .expect(201);
    expect(res.body.lab.slug).toBe(`${word.slice(0, 46)}-2`);
    expect(res.body.lab.slug).toHaveLength(48);
  });
});

describe('the lab guard for a lab that is not yours and one that does not exist', () => {
  it('sends the same statements and answers the same 404 (session)', async () => {
    const foreign = await buildLabWithEverything(t.db);
    const cookie = await newPerson();
    const get = (slug: string) => statementsOf(() => request(t.app).get(`/api/v1/labs/${slug}/channels`).set('Cookie', cookie));
    await get(`no-such-lab-${unique()}`); // warm the session row so both measured requests do the same session work
    const theirs = await get(foreign.lab.slug);
    const missing = await get(`no-such-lab-${unique()}`);
    expect(theirs.result.status).toBe(404);
    expect(theirs.result.body).toEqual(missing.result.body);
    expect(theirs.sql.length).toBeGreaterThan(0);
    expect(theirs.sql).toEqual(missing.sql);
    // The guard's own statement: the lab joined to the person's membership, once.
    expect(theirs.sql.filter((s) => /from `labs`/i.test(s))).toHaveLength(1);
    expect(theirs.sql.filter((s) => /`memberships`/i.test(s))).toHaveLength(1);
  });

  it('sends the same statements for a personal token on a lab its owner is not in and on a missing lab', async () => {
    const own = await buildLabWithEverything(t.db);
    const foreign = await buildLabWithEverything(t.db);
    const get = (slug: string) => statementsOf(() => request(t.app).get(`/api/v1/labs/${slug}/channels`).set('Authorization', `Bearer ${own.personalToken}`));
    const theirs = await get(foreign.lab.slug);
    const missing = await get(`no-such-lab-${unique()}`);
    expect(theirs.result.status).toBe(404);
    expect(theirs.result.body).toEqual(missing.result.body);
    expect(theirs.sql).toEqual(missing.sql);
  });

  it('still lets a member in with one guard statement', async () => {
    const lab = await buildLabWithEverything(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, lab.guest.id);
    const { result, sql } = await statementsOf(() => request(t.app).get(`/api/v1/labs/${lab.lab.slug}`).set('Cookie', cookie));
    expect(result.status).toBe(200);
    expect(result.body.role).toBe('guest');
    expect(sql.filter((s) => /from `labs`/i.test(s))).toHaveLength(1);
  });
});
