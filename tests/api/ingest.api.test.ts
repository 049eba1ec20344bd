import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createApp } from '../../server/app.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createDb } from '../../server/db/create-db.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

const T0 = Date.UTC(2026, 5, 1, 0, 0, 0);

async function freshLogger(): Promise<LabWithEverything> {
  return buildLabWithEverything(t.db);
}

function post(f: LabWithEverything, body: unknown, app = t.app) {
  return request(app)
    .post('/api/v1/ingest')
    .set('Authorization', `Bearer ${f.ingestKey}`)
    .send(body as object);
}

async function stored(f: LabWithEverything) {
  return t.db('readings').where({ tenant_id: f.lab.id }).orderBy('ts').select('ts', 'value');
}

describe('POST /api/v1/ingest (JSON)', () => {
  it('stores a batch, answers only after commit, and updates the logger and key last-seen times', async () => {
    const f = await freshLogger();
    const readings = Array.from({ length: 120 }, (_, i) => ({ channel: 'air_t', ts: new Date(T0 + i * 30_000).toISOString(), value: 10 + i / 10 }));
    const res = await post(f, { readings }).expect(200);
    expect(res.body).toEqual({ accepted: 120, duplicates: 0, quarantined: [] });
    const rows = await stored(f);
    expect(rows).toHaveLength(120);
    expect(rows[5]).toEqual({ ts: T0 + 5 * 30_000, value: 10.5 });
    const logger = await t.db('loggers').where({ tenant_id: f.lab.id, id: f.ids.loggerId }).first();
    expect(Number(logger.last_seen_at)).toBeGreaterThan(Date.now() - 60_000);
    const key = await t.db('ingest_keys').where({ tenant_id: f.lab.id, id: f.ids.keyId }).first();
    expect(key.last_used_at).not.toBeNull();
  });

  it('keeps rollups equal to the raw readings at every resolution', async () => {
    const f = await freshLogger();
    const readings = Array.from({ length: 500 }, (_, i) => ({ channel: 'air_t', ts: T0 + i * 17_000, value: Math.sin(i / 7) * 5 + i / 100 }));
    await post(f, { readings: readings.slice(0, 300) }).expect(200);
    await post(f, { readings: readings.slice(250) }).expect(200);
    for (const res of [60, 3600, 86400]) {
      const ms = res * 1000;
      const expected = await t
        .db('readings')
        .where({ tenant_id: f.lab.id, channel_id: f.ids.channelId })
        .select(t.db.raw('ts - MOD(ts, ?) as b', [ms]))
        .min({ mn: 'value' })
        .max({ mx: 'value' })
        .sum({ s: 'value' })
        .count({ n: '*' })
        .groupBy('b')
        .orderBy('b');
      const rollups = await t.db('reading_rollups').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId, resolution_s: res }).orderBy('bucket_start');
      expect(
        rollups.map((r) => [Number(r.bucket_start), r.min_value, r.max_value, Number(r.count_value)]),
        `resolution ${res}`,
      ).toEqual(expected.map((e: Record<string, unknown>) => [Number(e.b), e.mn, e.mx, Number(e.n)]));
      rollups.forEach((r, i) => expect(r.sum_value).toBeCloseTo(Number((expected[i] as Record<string, unknown>).s), 9));
    }
  });

  it('a re-sent batch creates no duplicate rows and is counted as duplicates', async () => {
    const f = await freshLogger();
    const readings = Array.from({ length: 50 }, (_, i) => ({ channel: 'air_t', ts: T0 + i * 60_000, value: i }));
    await post(f, { readings }).expect(200);
    const again = await post(f, { readings }).expect(200);
    expect(again.body).toEqual({ accepted: 0, duplicates: 50, quarantined: [] });
    expect(await stored(f)).toHaveLength(50);
  });

  it('a re-sent value with 17 significant digits is a duplicate, not a conflict (exact doubles)', async () => {
    const f = await freshLogger();
    const readings = [
      { channel: 'air_t', ts: T0, value: 9.464301757086481 },
      { channel: 'air_t', ts: T0 + 1000, value: 0.1 + 0.2 },
    ];
    await post(f, { readings }).expect(200);
    const again = await post(f, { readings }).expect(200);
    expect(again.body).toEqual({ accepted: 0, duplicates: 2, quarantined: [] });
  });

  it('a different value for a stored time keeps the stored value and quarantines the newcomer', async () => {
    const f = await freshLogger();
    await post(f, { readings: [{ channel: 'air_t', ts: T0, value: 4.25 }] }).expect(200);
    const res = await post(f, {
      readings: [
        { channel: 'air_t', ts: T0, value: 9.5 },
        { channel: 'air_t', ts: T0 + 60_000, value: 5 },
      ],
    }).expect(200);
    expect(res.body).toEqual({
      accepted: 1,
      duplicates: 0,
      quarantined: [
        { index: 0, code: 'conflicts_with_stored', reason: 'value: 9.5 differs from the value already stored for this time (4.25); the stored value was kept' },
      ],
    });
    expect(await stored(f)).toEqual([
      { ts: T0, value: 4.25 },
      { ts: T0 + 60_000, value: 5 },
    ]);
  });

  it('within one batch, in or out of time order: a repeated time with the same value is a duplicate, with another value a conflict', async () => {
    const f = await freshLogger();
    const at = (s: number) => T0 + s * 1000;
    const res = await post(f, {
      readings: [
        { channel: 'air_t', ts: at(1), value: 1 },
        { channel: 'air_t', ts: at(3), value: 3 },
        { channel: 'air_t', ts: at(2), value: 2 }, // back in time, new
        { channel: 'air_t', ts: at(1), value: 1 }, // back in time, same value: duplicate
        { channel: 'air_t', ts: at(3), value: 30 }, // repeat of the newest, another value: conflict
        { channel: 'air_t', ts: at(4), value: 4 }, // forward again
        { channel: 'air_t', ts: at(2), value: 20 }, // repeat of a row that came out of order: conflict
      ],
    }).expect(200);
    expect(res.body.accepted).toBe(4);
    expect(res.body.duplicates).toBe(1);
    expect(res.body.quarantined.map((q: { index: number; code: string }) => [q.index, q.code])).toEqual([
      [4, 'conflict_in_batch'],
      [6, 'conflict_in_batch'],
    ]);
    expect(await stored(f)).toEqual([1, 2, 3, 4].map((s) => ({ ts: at(s), value: s })));
  });

  it('quarantines unreadable rows with their reasons and stores the rest', async () => {
    const f = await freshLogger();
    const res = await post(f, {
      readings: [
        { channel: 'air_t', ts: '2026-06-01T00:00:00+02:00', value: 1 },
        { channel: 'soil_t', ts: T0, value: 2 },
        { channel: 'air_t', ts: 'noon', value: 3 },
        { channel: 'air_t', ts: T0 + 1000, value: 'warm' },
        { channel: 'air_t', ts: T0 + 2000, value: '1e999' },
        { channel: 'air_t', ts: T0 + 3000 },
        'not an object',
        { channel: 'air_t', ts: '2026-06-01T00:00:00', value: 4 },
        { channel: 'air_t', ts: Date.now() + 3 * 86400_000, value: 5 },
        { channel: 'air_t', ts: T0 + 4000, value: '6.5' },
      ],
    }).expect(200);
    expect(res.body.accepted).toBe(2);
    expect(res.body.duplicates).toBe(0);
    expect(res.body.quarantined.map((q: { index: number; code: string }) => [q.index, q.code])).toEqual([
      [1, 'unknown_channel'],
      [2, 'bad_time'],
      [3, 'bad_value'],
      [4, 'bad_value'],
      [5, 'bad_value'],
      [6, 'missing_channel'],
      [7, 'bad_time'],
      [8, 'time_out_of_range'],
    ]);
    expect(res.body.quarantined[6].reason).toBe('ts: "2026-06-01T00:00:00" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds)');
    const q = await t.db('quarantined_rows').where({ tenant_id: f.lab.id, source: 'api' }).whereNot('id', f.ids.quarantinedId).orderBy('row_index');
    expect(q.map((r) => r.row_index)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(q[0].channel_key).toBe('soil_t');
    expect(q[5].raw).toBe('"not an object"');
    expect(await stored(f)).toEqual([
      { ts: T0 - 2 * 3600_000, value: 1 },
      { ts: T0 + 4000, value: 6.5 },
    ]);
  });

  it('accounts for every row of any batch: accepted + duplicates + quarantined = sent (property)', async () => {
    const f = await freshLogger();
    const row = fc.oneof(
      fc.record({ channel: fc.constant('air_t'), ts: fc.integer({ min: 0, max: 40 }).map((i) => T0 + i * 1000), value: fc.integer({ min: -5, max: 5 }) }),
      fc.record({
        channel: fc.constantFrom('air_t', 'nope', ''),
        ts: fc.oneof(fc.string(), fc.integer()),
        value: fc.oneof(fc.double(), fc.string(), fc.constant(null)),
      }),
      fc.anything(),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(row, { maxLength: 40 }), async (readings) => {
        const before = (await stored(f)).length;
        const res = await post(f, { readings });
        expect(res.status).toBe(200);
        expect(res.body.accepted + res.body.duplicates + res.body.quarantined.length).toBe(readings.length);
        expect((await stored(f)).length).toBe(before + res.body.accepted);
      }),
      { numRuns: 40 },
    );
  });
});

describe('POST /api/v1/ingest (CSV)', () => {
  it('reads text/csv with a channel,ts,value header in any order', async () => {
    const f = await freshLogger();
    const csv =
      'ts,Value,channel\r\n2026-06-01T00:00:00Z,1.5,air_t\r\n2026-06-01T00:01:00Z,2.5,air_t\r\n2026-06-01T00:02:00Z,x,air_t\r\n2026-06-01T00:03:00Z,3\r\n';
    const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'text/csv').send(csv).expect(200);
    expect(res.body.accepted).toBe(2);
    expect(res.body.quarantined.map((q: { index: number; code: string }) => [q.index, q.code])).toEqual([
      [2, 'bad_value'],
      [3, 'missing_channel'],
    ]);
  });

  it('refuses a CSV without the required header with 400 and the exact message', async () => {
    const f = await freshLogger();
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .set('Content-Type', 'text/csv')
      .send('time,reading\n1,2\n')
      .expect(400);
    expect(res.body.error).toEqual({ code: 'invalid_input', message: 'header: expected columns channel, ts, value (got time, reading)' });
  });
});

describe('ingest refusals', () => {
  it('401 for a missing, malformed, unknown or revoked key, and for a retired logger', async () => {
    const f = await freshLogger();
    const body = { readings: [] };
    await request(t.app).post('/api/v1/ingest').send(body).expect(401);
    await request(t.app).post('/api/v1/ingest').set('Authorization', 'Bearer nonsense').send(body).expect(401);
    const forged = f.ingestKey.slice(0, -4) + 'AAAA';
    const res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${forged}`).send(body).expect(401);
    expect(res.body.error.code).toBe('invalid_ingest_key');
    await post(f, body).expect(200);
    await t.db('ingest_keys').where({ tenant_id: f.lab.id }).update({ revoked_at: new Date() });
    await post(f, body).expect(401);
  });

  it('400 for a body of the wrong shape and for malformed JSON', async () => {
    const f = await freshLogger();
    const shape = await post(f, { data: [] }).expect(400);
    expect(shape.body.error.message).toBe('body: expected {"readings": [{"channel": …, "ts": …, "value": …}, …]}');
    const malformed = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .set('Content-Type', 'application/json')
      .send('{"readings": [')
      .expect(400);
    expect(malformed.body.error.message).toBe('body: not valid JSON');
  });

  it('413 beyond the body limit, 415 for other content types', async () => {
    const f = await freshLogger();
    const huge = 'channel,ts,value\n' + 'air_t,1,1\n'.repeat(900_000);
    const big = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).set('Content-Type', 'text/csv').send(huge);
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
    const xml = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .set('Content-Type', 'application/xml')
      .send('<r/>')
      .expect(415);
    expect(xml.body.error.code).toBe('unsupported_media_type');
  });

  it('429 with Retry-After when one logger posts faster than its allowance; other loggers are unaffected', async () => {
    const app = createApp({
      config: t.config,
      db: t.db,
      logger: createLogWriter({ silent: true }),
      identity: { endpoints: { issuer: 'http://x', authorization_endpoint: 'http://x/a', token_endpoint: 'http://x/t', userinfo_endpoint: 'http://x/u' } },
      mailer: { send: async () => {}, verify: async () => true, close: () => {} },
      billing: {} as never,
      ingestRate: { perSecond: 0.5, burst: 2 },
    });
    const f = await freshLogger();
    const g = await freshLogger();
    await post(f, { readings: [] }, app).expect(200);
    await post(f, { readings: [] }, app).expect(200);
    const limited = await post(f, { readings: [] }, app).expect(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    expect(limited.body.error.code).toBe('rate_limited');
    await post(g, { readings: [] }, app).expect(200);
  });

  it('503 with Retry-After when the database is unreachable; the process stays up', async () => {
    const dead = createDb({ ...t.config.db, port: 1 });
    const app = createApp({
      config: t.config,
      db: dead,
      logger: createLogWriter({ silent: true }),
      identity: { endpoints: { issuer: 'http://x', authorization_endpoint: 'http://x/a', token_endpoint: 'http://x/t', userinfo_endpoint: 'http://x/u' } },
      mailer: { send: async () => {}, verify: async () => true, close: () => {} },
      billing: {} as never,
    });
    const f = await freshLogger();
    const res = await post(f, { readings: [{ channel: 'air_t', ts: T0, value: 1 }] }, app).expect(503);
    expect(res.headers['retry-after']).toBe('5');
    await dead.destroy();
  });
});
