import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { newIngestKey } from '../../server/services/ingest-key-format.ts';

/** Issue 15, finding 9: wrong ingest keys were never throttled (6,000 at 414/s, each a database lookup). */
let t: TestApp;
let f: LabWithEverything;
beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
});
afterAll(async () => t.close());

const post = (key: string) =>
  request(t.app)
    .post('/api/v1/ingest')
    .set('Authorization', `Bearer ${key}`)
    .send({ readings: [{ channel: 'air_t', ts: Date.UTC(2026, 10, 1), value: 1 }] });

describe('wrong ingest keys from one address', () => {
  it('are answered 401 twenty times a minute, then 429 with Retry-After; a working key from the same address still stores', async () => {
    // the first valid post registers the key as working in this process
    await post(f.ingestKey).expect(200);
    const wrong = `lbk_${'0'.repeat(12)}_${'A'.repeat(43)}`;
    for (let i = 0; i < 20; i++) await post(wrong).expect(401);
    const refused = await post(wrong).expect(429);
    expect(refused.body.error.code).toBe('too_many_wrong_keys');
    const wait = Number(refused.headers['retry-after']);
    expect(wait).toBeGreaterThanOrEqual(1);
    expect(wait).toBeLessThanOrEqual(60);
    expect(refused.body.error.message).toBe(`Too many wrong ingest keys from your address; retry in ${wait} s. Check the key the logger sends.`);
    // garbage that is not even a key counts too
    await post('nonsense').expect(429);
    const ok = await post(f.ingestKey).expect(200);
    expect(ok.body.accepted + ok.body.duplicates).toBe(1);
  });

  it('do not count valid lookups or refused bodies', async () => {
    const g = await buildLabWithEverything(t.db);
    // 25 more keys of the same logger, each used for the first time below (so none is "known good" yet)
    const keys = [];
    for (let i = 0; i < 25; i++) {
      const k = newIngestKey();
      await t
        .db('ingest_keys')
        .insert({ tenant_id: g.lab.id, id: Math.floor(Math.random() * 2 ** 40) + 1, logger_id: g.ids.loggerId, prefix: k.prefix, key_hash: k.hash });
      keys.push(k.key);
    }
    const other = await buildTestApp(); // fresh counters
    const send = (key: string) => request(other.app).post('/api/v1/ingest').set('Authorization', `Bearer ${key}`);
    try {
      for (const key of keys) await send(key).set('Content-Type', 'text/csv').send('no header').expect(400); // a valid key, a refused body
      const wrong = `lbk_${'1'.repeat(12)}_${'B'.repeat(43)}`;
      for (let i = 0; i < 20; i++) await send(wrong).send({ readings: [] }).expect(401);
      await send(wrong).send({ readings: [] }).expect(429);
    } finally {
      await other.close();
    }
  });
});
