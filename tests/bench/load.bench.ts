/**
 * `npm run bench:load` — mixed load on loopback: loggers posting batches while people browse.
 *
 * On a private MariaDB and one app process (bench-stack), LOGGERS loggers each post batches of
 * BATCH readings (one channel, one second apart) in a closed loop with PAUSE_MS between
 * batches, while BROWSERS signed-in people loop over the channels overview, a one-hour series
 * of a channel being written to, and the (cached) diagnostics of a seeded channel. It runs for
 * SECONDS, then prints throughput, p50/p99 latency per kind and the error count, and checks
 * that the stored readings equal the acknowledged ones. Targets: 0 errors and browsing
 * p99 ≤ 500 ms. Reports; asserts nothing.
 *
 * Settings (environment): BENCH_LOAD_SECONDS (60), BENCH_LOGGERS (50), BENCH_BROWSERS (10),
 * BENCH_BATCH (500), BENCH_LOGGER_PAUSE_MS (1000), BENCH_BROWSE_PAUSE_MS (100).
 * The readings are simulated (a daily cycle plus noise).
 */
import { performance } from 'node:perf_hooks';
import { startBenchStack, type BenchStack } from './support/bench-stack.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { median } from './bench-helpers.ts';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { readingsRepo } from '../../server/db/readings.repo.ts';
import { channelStateRepo } from '../../server/db/channel-state.repo.ts';
import { buildUser, sessionCookieFor } from '../support/factories.ts';

const setting = (name: string, fallback: number) => Number(process.env[name] ?? fallback);
const SECONDS = setting('BENCH_LOAD_SECONDS', 60);
const LOGGERS = setting('BENCH_LOGGERS', 50);
const BROWSERS = setting('BENCH_BROWSERS', 10);
const BATCH = setting('BENCH_BATCH', 500);
const PAUSE_MS = setting('BENCH_LOGGER_PAUSE_MS', 1000);
const BROWSE_PAUSE_MS = setting('BENCH_BROWSE_PAUSE_MS', 100);
const SECRET = 'bench-secret-bench-secret-bench-secret'; // the one tests/support/app-server-entry.ts uses
const MINUTE = 60_000;
const SEEDED_MINUTES = 20_000;

type Kind = 'ingest' | 'overview' | 'series' | 'diagnostics';
const latencies: Record<Kind, number[]> = { ingest: [], overview: [], series: [], diagnostics: [] };
const errors: Record<Kind, number> = { ingest: 0, overview: 0, series: 0, diagnostics: 0 };
const firstErrors: string[] = [];

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
/** p-th percentile by the nearest-rank method. */
const percentile = (values: number[], p: number) =>
  values.length ? [...values].sort((a, b) => a - b)[Math.max(0, Math.ceil((p / 100) * values.length) - 1)] : NaN;

/** One timed request; a non-2xx answer or no answer counts as an error of its kind. */
async function timed(kind: Kind, url: string, init: RequestInit): Promise<boolean> {
  const start = performance.now();
  try {
    const res = await fetch(url, init);
    const body = await res.text();
    latencies[kind].push(performance.now() - start);
    if (res.ok) return true;
    errors[kind]++;
    if (firstErrors.length < 5) firstErrors.push(`${kind} ${res.status}: ${body.slice(0, 200)}`);
  } catch (err) {
    errors[kind]++;
    if (firstErrors.length < 5) firstErrors.push(`${kind}: ${(err as Error).message}`);
  }
  return false;
}

async function seedReferenceChannel(stack: BenchStack, tenantId: number, channelId: number, t0: number): Promise<void> {
  let seed = 4242;
  const noise = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 2 ** 32 - 0.5;
  };
  const rows: Array<[number, number, number, number]> = [];
  let e = 0;
  for (let m = 0; m < SEEDED_MINUTES; m++) {
    e = 0.8 * e + noise();
    rows.push([tenantId, channelId, t0 + m * MINUTE, Math.round((6 + 3 * Math.sin((2 * Math.PI * m) / 1440) + e) * 1000) / 1000]);
  }
  for (let i = 0; i < rows.length; i += 5000)
    await stack.db.raw('INSERT INTO readings (tenant_id, channel_id, ts, value) VALUES ?', [rows.slice(i, i + 5000)] as never);
  const scope = inLab(stack.db, tenantId);
  await readingsRepo(scope).refreshRollups(
    [channelId],
    rows.map((r) => r[2]),
  );
  await channelStateRepo(scope).advance([{ channelId, ts: rows[rows.length - 1][2], added: rows.length }]);
}

function report(kind: Kind, seconds: number): void {
  const l = latencies[kind];
  console.log(
    `${kind.padEnd(12)} ${String(l.length).padStart(6)} requests  ${(l.length / seconds).toFixed(1).padStart(7)} req/s  p50 ${median(l).toFixed(1).padStart(7)} ms  p99 ${percentile(l, 99).toFixed(1).padStart(7)} ms  errors ${errors[kind]}`,
  );
}

async function main() {
  console.log(
    `load: ${LOGGERS} loggers × ${BATCH} readings per batch (pause ${PAUSE_MS} ms), ${BROWSERS} people browsing (pause ${BROWSE_PAUSE_MS} ms), ${SECONDS} s, loopback only`,
  );
  const stack = await startBenchStack();
  try {
    const lab = await labsRepo(stack.db).insert({ slug: 'bench-load', name: 'Bench load' });
    await onLargestPlan(stack.db, lab.id);
    const loggersService = createLoggersService({ db: stack.db });
    const labContext = { ...lab, role: 'admin' as const };
    const loggers: Array<{ key: string; channelId: number }> = [];
    for (let i = 0; i < LOGGERS; i++) {
      const { logger, issued } = await loggersService.register(labContext, null, {
        name: `Mast ${i + 1}`,
        timezone: 'UTC',
        expectedIntervalS: 1,
        channels: [{ key: 'air_t', label: 'Air temperature', unit: '°C' }],
      });
      loggers.push({ key: issued.key, channelId: logger.channels[0].id });
    }
    const { logger: reference } = await loggersService.register(labContext, null, {
      name: 'Reference mast',
      timezone: 'UTC',
      expectedIntervalS: 60,
      channels: [{ key: 'soil_t', label: 'Soil temperature', unit: '°C' }],
    });
    const referenceId = reference.channels[0].id;
    const now = Date.now();
    const seedFrom = now - 30 * 86_400_000;
    await seedReferenceChannel(stack, lab.id, referenceId, seedFrom);
    const cookies: string[] = [];
    for (let i = 0; i < BROWSERS; i++) {
      const user = await buildUser(stack.db);
      await stack.db('memberships').insert({ tenant_id: lab.id, user_id: user.id, role: 'scientist' });
      cookies.push(await sessionCookieFor(stack.db, SECRET, user.id));
    }
    const base = `${stack.appUrl}/api/v1/labs/${lab.slug}/channels`;
    const diagnosticsUrl = `${base}/${referenceId}/diagnostics?from=${seedFrom}&to=${seedFrom + SEEDED_MINUTES * MINUTE}&step=60`;
    const warm = await fetch(diagnosticsUrl, { headers: { cookie: cookies[0] } });
    if (!warm.ok) throw new Error(`diagnostics warm-up failed: ${warm.status} ${await warm.text()}`);

    // Each logger writes one second apart from two hours ago onwards (well inside "not in the future").
    const writeFrom = now - 2 * 3_600_000;
    const acknowledged = new Array<number>(LOGGERS).fill(0);
    const started = performance.now();
    const end = started + SECONDS * 1000;
    const loggerLoops = loggers.map(async (l, i) => {
      await sleep((i * PAUSE_MS) / LOGGERS); // spread the first posts
      for (let b = 0; performance.now() < end; b++) {
        const body = JSON.stringify({
          readings: Array.from({ length: BATCH }, (_, k) => ({
            channel: 'air_t',
            ts: writeFrom + (b * BATCH + k) * 1000,
            value: 10 + Math.sin((b * BATCH + k) / 600),
          })),
        });
        const ok = await timed('ingest', `${stack.appUrl}/api/v1/ingest`, {
          method: 'POST',
          headers: { authorization: `Bearer ${l.key}`, 'content-type': 'application/json' },
          body,
        });
        if (ok) acknowledged[i] += BATCH;
        else b--; // a real logger re-sends the batch it could not deliver
        await sleep(PAUSE_MS);
      }
    });
    const browseLoops = cookies.map(async (cookie, p) => {
      for (let n = 0; performance.now() < end; n++) {
        const headers = { cookie };
        await timed('overview', base, { headers });
        await sleep(BROWSE_PAUSE_MS);
        const target = loggers[(p + n) % loggers.length].channelId;
        const t = Date.now();
        await timed('series', `${base}/${target}/series?from=${t - 3_600_000}&to=${t}&points=500`, { headers });
        await sleep(BROWSE_PAUSE_MS);
        await timed('diagnostics', diagnosticsUrl, { headers });
        await sleep(BROWSE_PAUSE_MS);
      }
    });
    await Promise.all([...loggerLoops, ...browseLoops]);
    const seconds = (performance.now() - started) / 1000;

    const [{ n }] = await stack
      .db('readings')
      .whereIn(
        'channel_id',
        loggers.map((l) => l.channelId),
      )
      .count({ n: '*' });
    const ackTotal = acknowledged.reduce((a, b) => a + b, 0);
    console.log(`ran ${seconds.toFixed(1)} s`);
    for (const kind of Object.keys(latencies) as Kind[]) report(kind, seconds);
    const browsing = [...latencies.overview, ...latencies.series, ...latencies.diagnostics];
    const errorCount = Object.values(errors).reduce((a, b) => a + b, 0);
    console.log(
      `ingestion: ${Math.round(ackTotal / seconds).toLocaleString('en')} readings/s acknowledged; stored ${Number(n).toLocaleString('en')} of ${ackTotal.toLocaleString('en')} acknowledged`,
    );
    console.log(`browsing (all kinds): p50 ${median(browsing).toFixed(1)} ms, p99 ${percentile(browsing, 99).toFixed(1)} ms (target ≤ 500 ms)`);
    console.log(`errors: ${errorCount} (target 0)`);
    for (const line of firstErrors) console.log(`  ${line}`);
  } finally {
    await stack.stop();
  }
}

void main();
