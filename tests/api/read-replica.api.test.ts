/**
 * The read/write split on the real MariaDB (server/db/read-replica.ts). A lagging reader is
 * simulated deterministically: a second database on the same test server holds a copy of the
 * tables the lag-tolerant reads touch, refreshed only when the test says so, so it is exactly
 * as stale as the test makes it. The copy is made distinguishable — every reading (and rollup,
 * and channel's last value) is 1000 higher there — so each answer shows which database it came
 * from, and the app's read counters say why. The readings are simulated (behaviour checks);
 * expected values are the ones posted here.
 */
import { execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { parse as parseCsv } from 'csv-parse/sync';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { startAppProcess, stopAppProcess } from '../support/app-process.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import type { ReadReplica } from '../../server/db/read-replica.ts';

const STEP = 600_000; // a reading every 10 minutes
const DAY_STEPS = 144;
const T0 = Date.UTC(2026, 8, 1);
const FIRST_DAYS = 5;
/** What the reader's copy adds to every value: 20-ish on the writer, 1020-ish on the reader. */
const SHIFT = 1000;
/** The tables the series, diagnostics, export and channel-list reads touch. */
const COPIED = ['loggers', 'channels', 'readings', 'reading_rollups'];

const writerName = testConfig().db.database;
const readerName = `${writerName}_reader`;
let readDb: Db;
let t: TestApp;
let f: LabWithEverything;
let cookie: string;
let base: string;
const posted: Array<{ ts: number; value: number }> = [];

/** A seeded generator (Numerical Recipes' LCG constants), so the simulated data repeat exactly. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32 - 0.5;
  };
}
const noise = lcg(21);

/** Posts `days` more days of the air channel through the writer (a daily cycle plus noise). */
async function postDays(days: number) {
  const start = posted.length;
  const rows = Array.from({ length: days * DAY_STEPS }, (_, k) => {
    const i = start + k;
    return { channel: 'air_t', ts: T0 + i * STEP, value: 20 + 3 * Math.sin((2 * Math.PI * i) / DAY_STEPS) + noise() };
  });
  await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings: rows }).expect(200);
  posted.push(...rows.map((r) => ({ ts: r.ts, value: r.value })));
}

/** Brings the reader's copy up to date with the writer, every value made SHIFT higher there. */
async function syncReader() {
  for (const table of COPIED) {
    await t.db.raw(`DELETE FROM \`${readerName}\`.\`${table}\``);
    await t.db.raw(`INSERT INTO \`${readerName}\`.\`${table}\` SELECT * FROM \`${writerName}\`.\`${table}\``);
  }
  await t.db.raw(`UPDATE \`${readerName}\`.readings SET value = value + ?`, [SHIFT]);
  await t.db.raw(`UPDATE \`${readerName}\`.reading_rollups SET min_value = min_value + ?, max_value = max_value + ?, sum_value = sum_value + ? * count_value`, [
    SHIFT,
    SHIFT,
    SHIFT,
  ]);
  await t.db.raw(`UPDATE \`${readerName}\`.channels SET last_reading_value = last_reading_value + ? WHERE last_reading_value IS NOT NULL`, [SHIFT]);
}

const get = (app: TestApp, path: string) => request(app.app).get(path).set('Cookie', cookie).expect(200);
const range = () => `from=${new Date(T0).toISOString()}&to=${new Date(T0 + posted.length * STEP).toISOString()}`;

/** The chart series of every posted reading (few enough to come back as they are). */
async function series(app: TestApp) {
  const res = await get(app, `${base}/channels/${f.ids.channelId}/series?${range()}&points=5000`);
  expect(res.body.series.shape).toBe('readings');
  // The fixture's channel expects a reading a minute, so a gap marker (null) follows each 10-minute reading: leave them out.
  const { t: times, value } = res.body.series as { t: number[]; value: Array<number | null> };
  const kept = times.map((ts, i) => [ts, value[i]] as const).filter(([, v]) => v !== null);
  return { t: kept.map(([ts]) => ts), value: kept.map(([, v]) => v) };
}

/** The readings export as rows of [epoch ms, value]. */
async function csv(app: TestApp) {
  const res = await get(app, `${base}/channels/${f.ids.channelId}/readings.csv?${range()}`);
  const rows = parseCsv(res.text, { columns: true }) as Array<{ epoch_ms: string; value: string }>;
  return rows.map((r) => [Number(r.epoch_ms), Number(r.value)]);
}

/** The diagnostics report: how many readings it analysed and the mean of its STL trend. */
async function diagnostics(app: TestApp, stepS: number) {
  const res = await get(app, `${base}/channels/${f.ids.channelId}/diagnostics?${range()}&step=${stepS}`);
  const trend = (res.body.decomposition.trend as Array<number | null>).filter((v): v is number => v !== null);
  return { readings: res.body.series.readings as number, trendMean: trend.reduce((s, v) => s + v, 0) / trend.length, cached: res.body.cached as boolean };
}

/** A port nobody listens on: taken from the system, then released. */
const closedPort = () =>
  new Promise<number>((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as { port: number };
      probe.close(() => resolve(port));
    });
  });

/** A supertest parser that keeps the body as bytes. */
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

/** The air channel's readings file of the lab's full export (read back with Python's zipfile module), as rows of [epoch ms, value]. */
async function labExportReadings(app: TestApp) {
  const founder = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  const res = await request(app.app).get(`${base}/export.zip`).set('Cookie', founder).buffer(true).parse(binary).expect(200);
  const file = join(mkdtempSync(join(tmpdir(), 'lagbook-reader-export-')), 'export.zip');
  writeFileSync(file, res.body as Buffer);
  const script = 'import sys, zipfile\nz = zipfile.ZipFile(sys.argv[1])\nassert z.testzip() is None\nsys.stdout.write(z.read(sys.argv[2]).decode("utf-8"))';
  const text = execFileSync('/usr/bin/python3', ['-c', script, file, `readings/logger-${f.ids.loggerId}/air_t.csv`], {
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  return (parseCsv(text, { columns: true }) as Array<{ epoch_ms: string; value: string }>).map((r) => [Number(r.epoch_ms), Number(r.value)]);
}

const counts = (app: TestApp) => (app.app.locals.readReplica as ReadReplica).counts();
const values = (shift: number) => posted.map((p) => p.value + shift);

beforeAll(async () => {
  readDb = createDb({ ...testConfig().db, database: readerName }, { reader: true });
  t = await buildTestApp({}, { readDb });
  await t.db.raw(`DROP DATABASE IF EXISTS \`${readerName}\``);
  await t.db.raw(`CREATE DATABASE \`${readerName}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  for (const table of COPIED) await t.db.raw(`CREATE TABLE \`${readerName}\`.\`${table}\` LIKE \`${writerName}\`.\`${table}\``);
  f = await buildLabWithEverything(t.db);
  await onLargestPlan(t.db, f.lab.id); // the simulated readings reach back further than the free plan shows
  const scientist = await buildMember(t.db, f.lab, { role: 'scientist' });
  cookie = await sessionCookieFor(t.db, t.config.sessionSecret, scientist.id);
  base = `/api/v1/labs/${f.lab.slug}`;
  await postDays(FIRST_DAYS);
});

afterAll(async () => {
  await t?.close();
  await readDb?.destroy();
  const cleanup = createDb(testConfig().db);
  await cleanup.raw(`DROP DATABASE IF EXISTS \`${readerName}\``);
  await cleanup.destroy();
});

describe('a reader that has caught up', () => {
  it('serves the series, the diagnostics input, the readings export and the readings of the full lab export', async () => {
    await syncReader();
    const before = counts(t);
    const s = await series(t);
    expect(s.t).toEqual(posted.map((p) => p.ts));
    expect(s.value).toEqual(values(SHIFT));
    expect(await csv(t)).toEqual(posted.map((p) => [p.ts, p.value + SHIFT]));
    expect(await labExportReadings(t)).toEqual(posted.map((p) => [p.ts, p.value + SHIFT]));
    const d = await diagnostics(t, 600);
    expect(d.readings).toBe(posted.length);
    expect(d.trendMean).toBeGreaterThan(SHIFT); // the copy's level (≈ 1020), not the writer's (≈ 20)
    const after = counts(t);
    expect(after.reader - before.reader).toBeGreaterThanOrEqual(4);
    expect(after.stale).toBe(before.stale);
    expect(after.unreachable).toBe(before.unreachable);
  });
});

describe('a reader that lags behind the writer', () => {
  it('answers the fresh readings from the writer, and from the reader again once it catches up', async () => {
    await syncReader();
    await postDays(1); // stored on the writer only: the reader's data_version of the channel is now older
    const before = counts(t);
    const s = await series(t);
    expect(s.t).toEqual(posted.map((p) => p.ts));
    expect(s.value).toEqual(values(0));
    expect(await csv(t)).toEqual(posted.map((p) => [p.ts, p.value]));
    expect(await labExportReadings(t)).toEqual(posted.map((p) => [p.ts, p.value]));
    const d = await diagnostics(t, 600);
    expect(d).toMatchObject({ readings: posted.length, cached: false });
    expect(d.trendMean).toBeLessThan(100);
    const stale = counts(t);
    expect(stale.stale - before.stale).toBeGreaterThanOrEqual(4);
    expect(stale.reader).toBe(before.reader);

    await syncReader();
    expect((await series(t)).value).toEqual(values(SHIFT));
    expect(await csv(t)).toEqual(posted.map((p) => [p.ts, p.value + SHIFT]));
    // The same request is answered from the cache the writer's read filled under this data
    // version (still right: nothing was stored since); another step reads the grid anew, from the reader.
    expect(await diagnostics(t, 600)).toMatchObject({ readings: posted.length, cached: true });
    const fresh = await diagnostics(t, 1200);
    expect(fresh).toMatchObject({ readings: posted.length, cached: false });
    expect(fresh.trendMean).toBeGreaterThan(SHIFT);
    const caughtUp = counts(t);
    expect(caughtUp.reader - stale.reader).toBeGreaterThanOrEqual(3);
    expect(caughtUp.stale).toBe(stale.stale);
  });

  it('lists channels (channels page and lab overview) from the reader until a channel is renamed on the writer, then from the writer until the reader has the change', async () => {
    await syncReader();
    const channelIn = async () => (await get(t, `${base}/channels`)).body.channels.find((c: { id: number }) => c.id === f.ids.channelId);
    // the lab overview lists the channel as silent (its readings ended months before now)
    const silentIn = async () => (await get(t, `${base}/overview`)).body.channels.silent.find((c: { id: number }) => c.id === f.ids.channelId);
    const last = posted[posted.length - 1];
    expect(await channelIn()).toMatchObject({ label: 'Air temperature', lastReading: { value: last.value + SHIFT } });
    expect(await silentIn()).toMatchObject({ label: 'Air temperature', lastReading: { value: last.value + SHIFT } });

    const founder = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    await request(t.app)
      .patch(`${base}/loggers/${f.ids.loggerId}/channels/${f.ids.channelId}`)
      .set('Cookie', founder)
      .send({ label: 'Air temperature (north mast)' })
      .expect(200);
    const before = counts(t);
    expect(await channelIn()).toMatchObject({ label: 'Air temperature (north mast)', lastReading: { value: last.value } });
    expect(await silentIn()).toMatchObject({ label: 'Air temperature (north mast)', lastReading: { value: last.value } });
    expect(counts(t).stale).toBe(before.stale + 2);

    await syncReader();
    expect(await channelIn()).toMatchObject({ label: 'Air temperature (north mast)', lastReading: { value: last.value + SHIFT } });
    expect(await silentIn()).toMatchObject({ label: 'Air temperature (north mast)', lastReading: { value: last.value + SHIFT } });
    expect(counts(t).reader).toBe(before.reader + 2);
  });
});

describe('a reader that does not answer', () => {
  it('never breaks browsing: series, diagnostics, both exports and the channel lists come from the writer', async () => {
    const deadReader = createDb({ ...testConfig().db, database: readerName, port: await closedPort() }, { reader: true });
    const down = await buildTestApp({}, { readDb: deadReader });
    try {
      expect(await (down.app.locals.readReplica as ReadReplica).readerAnswers()).toBe(false);
      expect(await (t.app.locals.readReplica as ReadReplica).readerAnswers()).toBe(true);
      // health names the reader but stays 200: reads then use the writer
      const health = await request(down.app).get('/healthz');
      expect([health.status, health.body]).toEqual([200, { status: 'ok', database: 'ok', reader: 'unreachable' }]);
      expect((await request(t.app).get('/healthz')).body).toEqual({ status: 'ok', database: 'ok', reader: 'ok' });
      expect((await series(down)).value).toEqual(values(0));
      expect(await csv(down)).toEqual(posted.map((p) => [p.ts, p.value]));
      expect(await labExportReadings(down)).toEqual(posted.map((p) => [p.ts, p.value]));
      const d = await diagnostics(down, 1800); // a step no earlier request cached in this app
      expect(d.readings).toBe(posted.length);
      expect(d.trendMean).toBeLessThan(100);
      const list = (await get(down, `${base}/channels`)).body.channels as Array<{ id: number; lastReading: { value: number } }>;
      expect(list.find((c) => c.id === f.ids.channelId)?.lastReading.value).toBe(posted[posted.length - 1].value);
      const silent = (await get(down, `${base}/overview`)).body.channels.silent as Array<{ id: number; lastReading: { value: number } }>;
      expect(silent.find((c) => c.id === f.ids.channelId)?.lastReading.value).toBe(posted[posted.length - 1].value);
      const c = counts(down);
      expect(c.reader).toBe(0);
      // the first read finds the reader down; the rest skip it for a while instead of waiting on it again
      expect(c.unreachable).toBeGreaterThanOrEqual(6);
    } finally {
      await down.close();
      await deadReader.destroy();
    }
  });
});

describe('the server start (server/main.ts)', () => {
  /** Runs the production entry point with `env` added; resolves once it exits or `ready` sees it listening (then stops it). */
  function runMain(env: NodeJS.ProcessEnv, ready?: (port: number) => Promise<boolean>) {
    return async (port: number) => {
      const child = spawn('node', ['--import', 'tsx', join(import.meta.dirname, '../../server/main.ts')], {
        env: { ...process.env, LAGBOOK_PORT: String(port), LAGBOOK_PUBLIC_URL: `http://127.0.0.1:${port}`, ...env },
        stdio: ['ignore', 'ignore', 'pipe'],
      });
      let stderr = '';
      child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
      const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
      let listened = false;
      if (ready) {
        for (let i = 0; i < 300 && child.exitCode === null && !listened; i++) {
          listened = await ready(port).catch(() => false);
          if (!listened) await new Promise((r) => setTimeout(r, 100));
        }
        child.kill('SIGTERM');
      }
      const code = await exited;
      return { code, stderr, listened };
    };
  }

  it('stops with one clear line when the reader does not answer, and starts and stops cleanly with one that does', async () => {
    const deadPort = await closedPort();
    const refused = await runMain({ LAGBOOK_DB_READ_HOST: '127.0.0.1', LAGBOOK_DB_READ_PORT: String(deadPort) })(await closedPort());
    expect(refused.code).toBe(1);
    expect(refused.stderr).toBe(
      `lagbook: The database reader at 127.0.0.1:${deadPort} (${writerName}) does not answer. ` +
        'Check LAGBOOK_DB_READ_HOST and LAGBOOK_DB_READ_PORT, or unset both to read from the writer.\n',
    );

    // The writer's own address as the reader (a stand-in for a replica): the server starts, answers and stops.
    const healthy = async (port: number) => (await fetch(`http://127.0.0.1:${port}/healthz`)).ok;
    const started = await runMain({ LAGBOOK_DB_READ_HOST: '127.0.0.1', LAGBOOK_DB_READ_PORT: String(testConfig().db.port) }, healthy)(await closedPort());
    expect(started).toMatchObject({ listened: true, code: 0 });
  });
});

describe('an app process (tests/support/app-process.ts)', () => {
  it('passes the reader on to the app it starts', async () => {
    await syncReader();
    const child = await startAppProcess(t.config.db, await closedPort(), t.config.sessionSecret, { readDb: { ...t.config.db, database: readerName } });
    try {
      const res = await fetch(`${child.url}${base}/channels/${f.ids.channelId}/series?${range()}&points=5000`, { headers: { cookie } });
      expect(res.status).toBe(200);
      const body = (await res.json()) as { series: { value: Array<number | null> } };
      expect(body.series.value.filter((v) => v !== null)).toEqual(values(SHIFT));
    } finally {
      await stopAppProcess(child);
    }
  });
});
