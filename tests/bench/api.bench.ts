/**
 * `npm run bench:api` — latency of the channel browser's heavy endpoints on loopback.
 *
 * Seeds one channel with one year of one-minute readings (525,600: inserted straight into
 * `readings`, rollups computed by the same statements ingestion runs), then prints p50/p95 of:
 * 1. the series endpoint for the whole year at 2,000 points (target p50 ≤ 150 ms);
 * 2. the diagnostics endpoint over 100,000 one-minute steps, computed on the worker pool as in
 *    production: uncached (target p50 ≤ 300 ms; each request asks for another range, so the
 *    grid is read from the database and the engine runs; the first three requests after the
 *    server starts are reported on their own), with other parameters on a range just read (the
 *    grid from memory, the engine runs), and cached (target p50 ≤ 20 ms), with the answer's
 *    size (its decomposition comes thinned for drawing);
 * 3. the gzip size of the client's entry chunk in dist/client (or BENCH_CLIENT_DIR; build it
 *    first with `npx vite build`).
 * The readings are simulated (a daily cycle, AR(1) noise and one spike). Reports; asserts nothing.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { startBenchStack, type BenchStack } from './support/bench-stack.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { median } from './bench-helpers.ts';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { readingsRepo } from '../../server/db/readings.repo.ts';
import { channelStateRepo } from '../../server/db/channel-state.repo.ts';
import { buildUser, sessionCookieFor } from '../support/factories.ts';

const MINUTE = 60_000;
const YEAR_MINUTES = 525_600;
const T0 = Date.UTC(2025, 0, 1);
const SPIKE_MINUTE = 200_123;
const RUNS = Number(process.env.BENCH_RUNS ?? 30);

/** p-th percentile by the nearest-rank method. */
const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.max(0, Math.ceil((p / 100) * values.length) - 1)];

async function timeRequests(label: string, urls: string[], cookie: string, warmup = 2): Promise<unknown> {
  let last: unknown;
  for (let i = 0; i < warmup; i++) await (await fetch(urls[i % urls.length], { headers: { cookie } })).arrayBuffer();
  const times: number[] = [];
  let bytes = 0;
  for (const url of urls) {
    const start = performance.now();
    const res = await fetch(url, { headers: { cookie } });
    const body = await res.text();
    times.push(performance.now() - start);
    if (!res.ok) throw new Error(`${label}: ${res.status} ${body.slice(0, 300)}`);
    bytes = Buffer.byteLength(body);
    last = JSON.parse(body);
  }
  console.log(
    `${label}: p50 ${median(times).toFixed(1)} ms, p95 ${percentile(times, 95).toFixed(1)} ms (${times.length} requests, ${(bytes / 1024).toFixed(0)} kB each)`,
  );
  return last;
}

async function seedYear(stack: BenchStack, tenantId: number, channelId: number): Promise<void> {
  let seed = 12345;
  const noise = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 2 ** 32 - 0.5;
  };
  const started = performance.now();
  let e = 0;
  const times: number[] = [];
  for (let m0 = 0; m0 < YEAR_MINUTES; m0 += 10_000) {
    const rows: Array<[number, number, number, number]> = [];
    for (let m = m0; m < Math.min(YEAR_MINUTES, m0 + 10_000); m++) {
      e = 0.9 * e + noise();
      const value = m === SPIKE_MINUTE ? 80 : 12 + 6 * Math.sin((2 * Math.PI * m) / 1440) + 8 * Math.sin((2 * Math.PI * m) / YEAR_MINUTES) + e;
      rows.push([tenantId, channelId, T0 + m * MINUTE, Math.round(value * 1000) / 1000]);
      times.push(T0 + m * MINUTE);
    }
    await stack.db.raw('INSERT INTO readings (tenant_id, channel_id, ts, value) VALUES ?', [rows] as never);
  }
  const scope = inLab(stack.db, tenantId);
  await readingsRepo(scope).refreshRollups([channelId], times);
  await channelStateRepo(scope).advance([{ channelId, ts: times[times.length - 1], added: times.length }]);
  console.log(`seeded ${YEAR_MINUTES.toLocaleString('en')} one-minute readings and their rollups in ${((performance.now() - started) / 1000).toFixed(1)} s`);
}

function entryChunkGzip(): void {
  const dir = process.env.BENCH_CLIENT_DIR ?? join(import.meta.dirname, '..', '..', 'dist', 'client');
  const index = join(dir, 'index.html');
  if (!existsSync(index)) {
    console.log(`client entry chunk: no build at ${dir} (run npx vite build first)`);
    return;
  }
  const entry = /<script[^>]+type="module"[^>]+src="\/?([^"]+)"/.exec(readFileSync(index, 'utf8'))?.[1];
  if (!entry) {
    console.log('client entry chunk: no module script in index.html');
    return;
  }
  const code = readFileSync(join(dir, entry));
  console.log(`client entry chunk ${entry}: ${(code.length / 1024).toFixed(1)} kB raw, ${(gzipSync(code).length / 1024).toFixed(1)} kB gzip (target ≤ 150 kB)`);
}

async function main() {
  const stack = await startBenchStack();
  try {
    const lab = await labsRepo(stack.db).insert({ slug: 'bench-channels', name: 'Bench channels' });
    await onLargestPlan(stack.db, lab.id);
    const { logger } = await createLoggersService({ db: stack.db }).register({ ...lab, role: 'admin' }, null, {
      name: 'Roof station',
      timezone: 'UTC',
      expectedIntervalS: 60,
      channels: [{ key: 'air_t', label: 'Air temperature', unit: '°C' }],
    });
    const channelId = logger.channels[0].id;
    await seedYear(stack, lab.id, channelId);
    const user = await buildUser(stack.db);
    await stack.db('memberships').insert({ tenant_id: lab.id, user_id: user.id, role: 'scientist' });
    const cookie = await sessionCookieFor(stack.db, 'bench-secret-bench-secret-bench-secret', user.id);
    const base = `${stack.appUrl}/api/v1/labs/${lab.slug}/channels/${channelId}`;

    const yearEnd = T0 + YEAR_MINUTES * MINUTE;
    const seriesUrl = `${base}/series?from=${T0}&to=${yearEnd}&points=2000`;
    const series = (await timeRequests('series, whole year at 2,000 points', new Array(RUNS).fill(seriesUrl), cookie)) as {
      series: { source: string; resolutionS: number; bucketMs: number; t: number[]; max: Array<number | null> };
    };
    const s = series.series;
    console.log(
      `  drawn from ${s.source} ${s.resolutionS} s as ${s.t.length} buckets of ${s.bucketMs / 3_600_000} h (${2 * s.t.length} points); highest max ${Math.max(...s.max.filter((v): v is number => v !== null))} (the injected spike is 80)`,
    );

    const diagFrom = T0 + 30 * 1440 * MINUTE;
    // Each uncached request asks for another 100,000-minute range (shifted by whole hours), so
    // neither the answer nor the grid read from the database comes from memory.
    const diagUrl = (alpha: number, shiftMinutes = 0) =>
      `${base}/diagnostics?from=${diagFrom + shiftMinutes * MINUTE}&to=${diagFrom + (shiftMinutes + 100_000) * MINUTE}&step=60&alpha=${alpha}`;
    // The first requests after the server starts run while the JIT is still compiling the engine:
    // they are timed and printed on their own; the steady state follows.
    await timeRequests(
      'diagnostics, 100,000 points, uncached, the first 3 requests after start',
      [0.04, 0.0401, 0.0402].map((a, i) => diagUrl(a, 60 * (i + 1))),
      cookie,
      0,
    );
    const runs = Math.max(5, Math.ceil(RUNS / 2)) + 2;
    const uncached = Array.from({ length: runs }, (_, i) => diagUrl(0.05, 60 * (i + 4)));
    const report = (await timeRequests('diagnostics, 100,000 points, uncached', uncached, cookie, 0)) as {
      cached: boolean;
      series: { n: number };
      period: { used: number };
      identification: { verdict: string };
      decomposition: { thinned: { cells: number; of: number } | null };
    };
    const thinned = report.decomposition.thinned;
    console.log(
      `  n = ${report.series.n}, period ${report.period.used} steps, verdict ${report.identification.verdict}, cached ${report.cached}, decomposition ${thinned ? `thinned for drawing to ${thinned.cells} of ${thinned.of} cells` : 'at every cell'}`,
    );
    // Another parameter on a range just analysed: the engine runs, the grid comes from memory.
    await (await fetch(diagUrl(0.0499), { headers: { cookie } })).arrayBuffer(); // reads the grid (untimed)
    const retuned = Array.from({ length: runs }, (_, i) => diagUrl(0.05 + (i + 1) / 10_000));
    await timeRequests('diagnostics, 100,000 points, other parameters on a range just read (grid from memory)', retuned, cookie, 0);
    const hit = (await timeRequests('diagnostics, 100,000 points, cached', new Array(RUNS * 2).fill(diagUrl(0.05)), cookie, 1)) as { cached: boolean };
    console.log(`  cached ${hit.cached}`);
    entryChunkGzip();
  } finally {
    await stack.stop();
  }
}

void main();
