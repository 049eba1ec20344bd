/**
 * Rollup levels per channel on the real MariaDB (server/db/rollup-levels.ts): a channel keeps
 * only the levels strictly coarser than its reporting interval, and every answer — the series,
 * diagnostics, the sparkline, the reading count — is the same as one computed here from the raw
 * readings posted, whichever levels exist. Interval edits in both directions keep answers right,
 * and the migration removes exactly the redundant rows of a database filled the way ingestion
 * filled it before (every level for every channel). The readings are simulated (behaviour checks;
 * expected values are computed here from the readings posted).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { channelDiagnostics } from '../../server/analysis/index.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { LagbookMigrationSource, migrationsDirectory } from '../../server/db/migration-source.ts';
import { createRollupLevelsService } from '../../server/services/rollup-levels.service.ts';

const MIN = 60_000;
const HOUR = 3_600_000;
const DAY = 86_400_000;
const T0 = Date.UTC(2026, 5, 1);

interface Reading {
  channel: string;
  ts: number;
  value: number;
}

/** A seeded generator (Numerical Recipes' LCG constants), so the simulated data repeat exactly. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}

/** `n` readings of `channel` every `everyMs` from `t0`, a few seconds late now and then, a daily cycle plus noise. */
function simulate(channel: string, t0: number, everyMs: number, n: number, seed: number): Reading[] {
  const rnd = lcg(seed);
  return Array.from({ length: n }, (_, i) => {
    const ts = t0 + i * everyMs + (i % 5 === 3 ? Math.min(7000, Math.round(everyMs / 3)) : 0);
    return { channel, ts, value: Math.round((12 + 5 * Math.sin((2 * Math.PI * ts) / DAY) + rnd()) * 1000) / 1000 };
  });
}

let t: TestApp;
let f: LabWithEverything;
let admin: string;
let base: string;
const posted = new Map<number, Reading[]>();
const ids: Record<'fast' | 'minute' | 'hourly' | 'daily', number> = { fast: 0, minute: 0, hourly: 0, daily: 0 };

async function ingest(readings: Reading[]) {
  for (let i = 0; i < readings.length; i += 5000) {
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${f.ingestKey}`)
      .send({ readings: readings.slice(i, i + 5000) })
      .expect(200);
  }
}

async function addChannel(key: string, expectedIntervalS: number): Promise<number> {
  const res = await request(t.app)
    .post(`${base}/loggers/${f.ids.loggerId}/channels`)
    .set('Cookie', admin)
    .send({ key, label: key, unit: '°C', expectedIntervalS })
    .expect(201);
  return res.body.channel.id;
}

const setInterval = (channelId: number, expectedIntervalS: number | null) =>
  request(t.app).patch(`${base}/loggers/${f.ids.loggerId}/channels/${channelId}`).set('Cookie', admin).send({ expectedIntervalS }).expect(200);

const floorOf = async (channelId: number) => {
  const row = await t.db('channels').where({ tenant_id: f.lab.id, id: channelId }).first('finest_rollup_s as floor');
  return row.floor === null ? null : Number(row.floor);
};

/** Stored rollups of one level as [bucket, min, max, sum, count], in bucket order. */
async function rollupRows(db: Db, tenantId: number, channelId: number, res: number): Promise<number[][]> {
  const rows = await db('reading_rollups').where({ tenant_id: tenantId, channel_id: channelId, resolution_s: res }).orderBy('bucket_start');
  return rows.map((r) => [Number(r.bucket_start), r.min_value, r.max_value, r.sum_value, Number(r.count_value)]);
}

/** The same level computed from the stored raw readings. */
async function fromRaw(db: Db, tenantId: number, channelId: number, res: number): Promise<number[][]> {
  const ms = res * 1000;
  const rows = await db('readings')
    .where({ tenant_id: tenantId, channel_id: channelId })
    .select(db.raw('ts - MOD(ts, ?) as b', [ms]))
    .min({ mn: 'value' })
    .max({ mx: 'value' })
    .sum({ s: 'value' })
    .count({ n: '*' })
    .groupBy('b')
    .orderBy('b');
  return rows.map((r: Record<string, unknown>) => [Number(r.b), Number(r.mn), Number(r.mx), Number(r.s), Number(r.n)]);
}

/** Expects a level's rollups to equal the raw readings' summaries (sums to 1e-9: the order of addition differs). */
async function expectLevelMatchesRaw(db: Db, tenantId: number, channelId: number, res: number) {
  const [stored, expected] = await Promise.all([rollupRows(db, tenantId, channelId, res), fromRaw(db, tenantId, channelId, res)]);
  expect(stored.length, `level ${res}`).toBe(expected.length);
  expect(stored.length).toBeGreaterThan(0);
  expect(stored.map((r) => [r[0], r[1], r[2], r[4]])).toEqual(expected.map((r) => [r[0], r[1], r[2], r[4]]));
  stored.forEach((r, i) => expect(r[3]).toBeCloseTo(expected[i][3], 9));
}

const levelsStored = async (channelId: number) =>
  (await t.db('reading_rollups').where({ tenant_id: f.lab.id, channel_id: channelId }).distinct('resolution_s').orderBy('resolution_s')).map((r) =>
    Number(r.resolution_s),
  );

/** Asks for a series and checks every bucket (or reading) against the posted readings; returns the answer. */
async function expectSeriesFromRaw(channelId: number, from: number, to: number, points: number) {
  const res = await request(t.app).get(`${base}/channels/${channelId}/series?from=${from}&to=${to}&points=${points}`).set('Cookie', admin).expect(200);
  const s = res.body.series;
  const readings = posted.get(channelId)!;
  expect(s.shape).toBe('buckets');
  for (let i = 0; i < s.t.length; i++) {
    const inBucket = readings.filter((r) => r.ts >= s.t[i] && r.ts < s.t[i] + s.bucketMs);
    if (inBucket.length === 0) {
      expect([s.min[i], s.max[i], s.mean[i], s.count[i]]).toEqual([null, null, null, 0]);
      continue;
    }
    expect(s.min[i]).toBe(Math.min(...inBucket.map((r) => r.value)));
    expect(s.max[i]).toBe(Math.max(...inBucket.map((r) => r.value)));
    expect(s.count[i]).toBe(inBucket.length);
    expect(s.mean[i]).toBeCloseTo(inBucket.reduce((a, r) => a + r.value, 0) / inBucket.length, 9);
  }
  expect(s.count.reduce((a: number, n: number) => a + n, 0)).toBe(readings.filter((r) => r.ts >= s.from && r.ts < s.to).length);
  return s;
}

/** Asks for diagnostics (mean cells) and checks the correlogram against the engine run on the posted readings. */
async function expectDiagnosticsFromRaw(channelId: number, from: number, to: number, stepS: number) {
  const res = await request(t.app)
    .get(`${base}/channels/${channelId}/diagnostics?from=${new Date(from).toISOString()}&to=${new Date(to).toISOString()}&step=${stepS}&period=none`)
    .set('Cookie', admin)
    .expect(200);
  const inRange = posted.get(channelId)!.filter((r) => r.ts >= from && r.ts < to);
  const engine = channelDiagnostics(
    { timestamps: inRange.map((r) => r.ts), values: inRange.map((r) => r.value) },
    { step: stepS * 1000, agg: 'mean', difference: 0, seasonalDifference: 0, period: 'none', decomposition: 'stl', alpha: 0.05 },
  );
  expect(res.body.series.readings).toBe(inRange.length);
  expect(res.body.acf.values).toHaveLength(engine.acf.length);
  res.body.acf.values.forEach((v: number | null, k: number) => expect(v).toBeCloseTo(engine.acf[k], 9));
  return res.body;
}

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  await onLargestPlan(t.db, f.lab.id); // the simulated readings lie months back
  admin = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  base = `/api/v1/labs/${f.lab.slug}`;
  ids.fast = await addChannel('fast', 10);
  ids.minute = await addChannel('minute', 60);
  ids.hourly = await addChannel('hourly', 3600);
  ids.daily = await addChannel('daily', 86400);
  const all = [
    ...simulate('fast', T0, 10_000, 2 * 8640, 1),
    ...simulate('minute', T0, MIN, 4 * 1440, 2),
    ...simulate('hourly', T0, HOUR, 60 * 24, 3),
    ...simulate('daily', T0, DAY, 150, 4),
  ];
  for (const [key, id] of Object.entries(ids))
    posted.set(
      id,
      all.filter((r) => r.channel === key),
    );
  // Two posts per channel, the second overlapping the first: both writers (fold and recompute) run.
  for (const key of Object.keys(ids)) {
    const rows = all.filter((r) => r.channel === key);
    const half = Math.floor(rows.length / 2);
    await ingest(rows.slice(0, half + 10));
    await ingest(rows.slice(half));
  }
});
afterAll(async () => t.close());

describe('rollup levels kept per channel', () => {
  it('sets each new channel’s finest level from its interval', async () => {
    expect(await floorOf(ids.fast)).toBe(60);
    expect(await floorOf(ids.minute)).toBe(3600);
    expect(await floorOf(ids.hourly)).toBe(86400);
    expect(await floorOf(ids.daily)).toBeNull();
  });

  it('a 10-second channel keeps minute, hour and day rollups, each equal to its raw readings', async () => {
    expect(await levelsStored(ids.fast)).toEqual([60, 3600, 86400]);
    for (const res of [60, 3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.fast, res);
  });

  it('a 1-minute channel stores no minute rows, but hour and day rows equal to its raw readings', async () => {
    expect(await levelsStored(ids.minute)).toEqual([3600, 86400]);
    for (const res of [3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.minute, res);
  });

  it('an hourly channel keeps only days, a daily channel no rollups at all', async () => {
    expect(await levelsStored(ids.hourly)).toEqual([86400]);
    await expectLevelMatchesRaw(t.db, f.lab.id, ids.hourly, 86400);
    expect(await levelsStored(ids.daily)).toEqual([]);
  });
});

describe('answers are the raw readings’ whichever levels exist', () => {
  it('series: minute buckets of a 1-minute channel come from the raw readings, 2-hour buckets from the hour level', async () => {
    const fine = await expectSeriesFromRaw(ids.minute, T0, T0 + DAY, 200);
    expect(fine).toMatchObject({ source: 'raw', resolutionS: null, bucketMs: 15 * MIN });
    const coarse = await expectSeriesFromRaw(ids.minute, T0, T0 + 4 * DAY, 100);
    expect(coarse).toMatchObject({ source: 'rollup', resolutionS: 3600, bucketMs: 2 * HOUR });
  });

  it('series: a 10-second channel still reads its minute level; an hourly and a daily channel read what they keep', async () => {
    expect(await expectSeriesFromRaw(ids.fast, T0, T0 + DAY, 200)).toMatchObject({ source: 'rollup', resolutionS: 60 });
    expect(await expectSeriesFromRaw(ids.hourly, T0, T0 + 60 * DAY, 60)).toMatchObject({ source: 'rollup', resolutionS: 86400 });
    expect(await expectSeriesFromRaw(ids.hourly, T0, T0 + 10 * DAY, 100)).toMatchObject({ source: 'raw' });
    expect(await expectSeriesFromRaw(ids.daily, T0, T0 + 150 * DAY, 20)).toMatchObject({ source: 'raw', resolutionS: null });
  });

  it('diagnostics: the engine’s correlogram of the raw readings, from a kept level or the readings', async () => {
    const tenMin = await expectDiagnosticsFromRaw(ids.minute, T0, T0 + 4 * DAY, 600);
    expect(tenMin.method.resolved.source).toEqual({ kind: 'readings' });
    const hourly = await expectDiagnosticsFromRaw(ids.minute, T0, T0 + 4 * DAY, 3600);
    expect(hourly.method.resolved.source).toEqual({ kind: 'rollups', resolutionS: 3600 });
    const fast = await expectDiagnosticsFromRaw(ids.fast, T0, T0 + 2 * DAY, 600);
    expect(fast.method.resolved.source).toEqual({ kind: 'rollups', resolutionS: 60 });
    const daily = await expectDiagnosticsFromRaw(ids.daily, T0, T0 + 150 * DAY, 86400);
    expect(daily.method.resolved.source).toEqual({ kind: 'readings' });
  });

  it('detail: the reading count of channels with and without day rollups', async () => {
    for (const id of [ids.minute, ids.daily]) {
      const res = await request(t.app).get(`${base}/channels/${id}`).set('Cookie', admin).expect(200);
      expect(res.body.channel.readingCount).toBe(posted.get(id)!.length);
    }
  });

  it('overview: the sparkline of an hourly channel (no hour level) holds the hourly means of its readings', async () => {
    const g = await buildLabWithEverything(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, g.founder.id);
    const made = await request(t.app)
      .post(`/api/v1/labs/${g.lab.slug}/loggers/${g.ids.loggerId}/channels`)
      .set('Cookie', cookie)
      .send({ key: 'slow', label: 'Slow', unit: '%', expectedIntervalS: 3600 })
      .expect(201);
    const now = Date.now();
    const readings = Array.from({ length: 30 }, (_, i) => ({ channel: 'slow', ts: now - (i + 1) * HOUR + 60_000, value: 40 + i / 4 }));
    readings.push({ channel: 'slow', ts: now - 2 * HOUR + 120_000, value: 13 }); // two readings in one hour
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${g.ingestKey}`).send({ readings }).expect(200);
    expect((await t.db('reading_rollups').where({ tenant_id: g.lab.id, channel_id: made.body.channel.id, resolution_s: 3600 })).length).toBe(0);
    const res = await request(t.app).get(`/api/v1/labs/${g.lab.slug}/channels`).set('Cookie', cookie).expect(200);
    const row = res.body.channels.find((c: { id: number }) => c.id === made.body.channel.id);
    const startHour = row.sparkline.startHour;
    const expected = Array.from({ length: 24 }, (_, h) => {
      const inHour = readings.filter((r) => r.ts >= startHour + h * HOUR && r.ts < startHour + (h + 1) * HOUR);
      return inHour.length ? inHour.reduce((s, r) => s + r.value, 0) / inHour.length : null;
    });
    expect(expected.filter((m) => m !== null).length).toBeGreaterThan(20);
    row.sparkline.means.forEach((m: number | null, h: number) => {
      if (expected[h] === null) expect(m).toBeNull();
      else expect(m).toBeCloseTo(expected[h]!, 10);
    });
  });
});

describe('an interval edit changes the levels and keeps answers right', () => {
  it('finer: the minute level is built from the whole history before it is read', async () => {
    await setInterval(ids.minute, 20);
    expect(await floorOf(ids.minute)).toBe(60);
    expect(await levelsStored(ids.minute)).toEqual([60, 3600, 86400]);
    for (const res of [60, 3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.minute, res);
    expect(await expectSeriesFromRaw(ids.minute, T0, T0 + DAY, 200)).toMatchObject({ source: 'rollup', resolutionS: 60 });
    // new readings feed the new level at once
    const more = simulate('minute', T0 + 4 * DAY, 20_000, 500, 9);
    await ingest(more);
    posted.set(ids.minute, [...posted.get(ids.minute)!, ...more]);
    for (const res of [60, 3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.minute, res);
  });

  it('coarser: finer levels stop being read at once and their rows go; answers stay the raw readings’', async () => {
    await setInterval(ids.minute, 3600);
    expect(await floorOf(ids.minute)).toBe(86400);
    expect(await levelsStored(ids.minute)).toEqual([86400]);
    await expectLevelMatchesRaw(t.db, f.lab.id, ids.minute, 86400);
    expect(await expectSeriesFromRaw(ids.minute, T0, T0 + DAY, 200)).toMatchObject({ source: 'raw' });
    expect(await expectSeriesFromRaw(ids.minute, T0, T0 + 4 * DAY, 100)).toMatchObject({ source: 'raw' });
    await expectDiagnosticsFromRaw(ids.minute, T0, T0 + 4 * DAY, 3600);
    // and back to the logger's interval (60 s): hour level rebuilt, minute level not
    await setInterval(ids.minute, null);
    expect(await floorOf(ids.minute)).toBe(3600);
    expect(await levelsStored(ids.minute)).toEqual([3600, 86400]);
    for (const res of [3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.minute, res);
  });

  it('a daily channel made hourly gets its day level built; a logger’s new interval moves the channels that follow it', async () => {
    await setInterval(ids.daily, 3600);
    expect(await floorOf(ids.daily)).toBe(86400);
    await expectLevelMatchesRaw(t.db, f.lab.id, ids.daily, 86400);
    // the fixture's channel follows its logger (60 s) and was written without a floor (every level)
    const air = f.ids.channelId;
    await ingest(simulate('air_t', T0, MIN, 300, 5));
    expect(await levelsStored(air)).toEqual([60, 3600, 86400]);
    await request(t.app).patch(`${base}/loggers/${f.ids.loggerId}`).set('Cookie', admin).send({ expectedIntervalS: 300 }).expect(200);
    expect(await floorOf(air)).toBe(3600);
    expect(await levelsStored(air)).toEqual([3600, 86400]);
    expect(await floorOf(ids.fast)).toBe(60); // has its own interval
  });
});

describe('settling a whole lab (a maintenance job finishing what a crash cut short)', () => {
  it('builds a level an edit never finished, removes rows a cut-short removal left, and leaves settled channels alone', async () => {
    const service = createRollupLevelsService({ db: t.db });
    expect(await service.settleLab(f.lab.id)).toEqual([]);
    // a finer interval written, the build never run (as after a crash right after the edit's commit)
    await t.db('channels').where({ tenant_id: f.lab.id, id: ids.hourly }).update({ expected_interval_s: 120 });
    // minute rows of the 1-minute channel left behind by a removal cut short
    await t
      .db('reading_rollups')
      .insert({ tenant_id: f.lab.id, channel_id: ids.minute, resolution_s: 60, bucket_start: T0, min_value: 1, max_value: 1, sum_value: 1, count_value: 1 });
    const changed = await service.settleLab(f.lab.id);
    expect(changed.map((c) => [c.channelId, c.from, c.to, c.built, c.removed]).sort((a, b) => Number(a[0]) - Number(b[0]))).toEqual(
      [
        [ids.hourly, 86400, 3600, [3600], 0],
        [ids.minute, 3600, 3600, [], 1],
      ].sort((a, b) => Number(a[0]) - Number(b[0])),
    );
    for (const res of [3600, 86400]) await expectLevelMatchesRaw(t.db, f.lab.id, ids.hourly, res);
    expect(await expectSeriesFromRaw(ids.hourly, T0, T0 + 10 * DAY, 100)).toMatchObject({ source: 'rollup', resolutionS: 3600 });
    expect(await levelsStored(ids.minute)).toEqual([3600, 86400]);
    expect(await service.settleLab(f.lab.id)).toEqual([]);
  });
});

describe('migration 20261204110110_drop-redundant-rollups on a database filled before it', () => {
  const LAST_BEFORE = '20261204110099';
  const OURS = '20261204110110_drop-redundant-rollups';
  class Upto extends LagbookMigrationSource {
    constructor(private readonly last: string) {
      super(migrationsDirectory());
    }
    override async getMigrations(): Promise<string[]> {
      return (await super.getMigrations()).filter((m) => m.slice(0, m.lastIndexOf('.')) <= this.last);
    }
  }
  let admin2: Db;
  let db: Db;
  let name = '';

  afterAll(async () => {
    await db?.destroy();
    if (name) await admin2?.raw(`DROP DATABASE IF EXISTS \`${name}\``);
    await admin2?.destroy();
  });

  it('removes exactly the rows of levels finer than each channel’s interval, in batches, and reruns harmlessly', async () => {
    name = `${t.config.db.database}_rollup_levels`;
    admin2 = createDb(t.config.db);
    await admin2.raw(`DROP DATABASE IF EXISTS \`${name}\``);
    await admin2.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    db = createDb({ ...t.config.db, database: name });
    await db.migrate.latest({ migrationSource: new Upto(LAST_BEFORE), tableName: 'knex_migrations' });

    // A lab filled as ingestion filled it before: every channel with minute, hour and day rollups.
    const tenantId = 501;
    await db('labs').insert({ id: tenantId, slug: 'before', name: 'Before' });
    await db('loggers').insert({ tenant_id: tenantId, id: 7, name: 'L', timezone: 'UTC', expected_interval_s: 60 });
    const channels = [
      { id: 11, own: 10 }, // 10 s: keeps everything
      { id: 12, own: null }, // the logger's 60 s: loses minutes (12,500 of them: two delete statements)
      { id: 13, own: 900 }, // 15 min: loses minutes
      { id: 14, own: 3600 }, // hourly: keeps days
      { id: 15, own: 86400 }, // daily: keeps nothing
    ];
    for (const c of channels) {
      await db('channels').insert({
        tenant_id: tenantId,
        id: c.id,
        logger_id: 7,
        channel_key: `c${c.id}`,
        label: `c${c.id}`,
        unit: '',
        expected_interval_s: c.own,
      });
    }
    const every: Record<number, [number, number]> = { 11: [10_000, 3000], 12: [MIN, 12_500], 13: [15 * MIN, 800], 14: [HOUR, 400], 15: [DAY, 40] };
    for (const c of channels) {
      const [step, n] = every[c.id];
      const rows = simulate('x', T0, step, n, c.id).map((r) => ({ tenant_id: tenantId, channel_id: c.id, ts: r.ts, value: r.value }));
      for (let i = 0; i < rows.length; i += 2000) await db('readings').insert(rows.slice(i, i + 2000));
    }
    for (const res of [60, 3600, 86400]) {
      await db.raw(
        `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
         SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?), MIN(value), MAX(value), SUM(value), COUNT(*) FROM readings WHERE tenant_id = ?
         GROUP BY channel_id, ts - MOD(ts, ?)`,
        [res, res * 1000, tenantId, res * 1000],
      );
    }
    const before = new Map<string, number[][]>();
    for (const c of channels) for (const res of [60, 3600, 86400]) before.set(`${c.id}/${res}`, await rollupRows(db, tenantId, c.id, res));
    expect(before.get('12/60')).toHaveLength(12_500);

    await db.migrate.latest({ migrationSource: new Upto(OURS), tableName: 'knex_migrations' });
    const kept: Record<number, number[]> = { 11: [60, 3600, 86400], 12: [3600, 86400], 13: [3600, 86400], 14: [86400], 15: [] };
    const floors = await db('channels').where({ tenant_id: tenantId }).orderBy('id').select('id', 'finest_rollup_s as floor');
    expect(floors.map((r) => [Number(r.id), r.floor])).toEqual([
      [11, 60],
      [12, 3600],
      [13, 3600],
      [14, 86400],
      [15, null],
    ]);
    const check = async () => {
      for (const c of channels) {
        for (const res of [60, 3600, 86400]) {
          const now = await rollupRows(db, tenantId, c.id, res);
          expect(now, `channel ${c.id} level ${res}`).toEqual(kept[c.id].includes(res) ? before.get(`${c.id}/${res}`) : []);
        }
      }
    };
    await check();

    // rerun (as after a crash part-way): nothing else changes
    const { up } = await import('../../migrations/20261204110110_drop-redundant-rollups.ts');
    await up(db);
    await check();

    // down rebuilds the removed levels from the readings
    await db.migrate.down({ migrationSource: new Upto(OURS), tableName: 'knex_migrations' });
    for (const c of channels) for (const res of [60, 3600, 86400]) expect(await rollupRows(db, tenantId, c.id, res)).toEqual(before.get(`${c.id}/${res}`));
  });
});
