/**
 * Hostile and large ingest bodies, end to end (issue 15, finding 1). Run with
 * `npx tsx tests/bench/ingest-hostile.bench.ts` (no npm script yet).
 *
 * Starts the bench stack (private MariaDB, the app in a child process), registers one logger
 * and posts, one at a time: a good CSV of BENCH_HOSTILE_ROWS (default 100,000) readings, the
 * same readings as JSON, and the hostile CSV of issue 15 (`channel,ts,value` then `a` × 1,000,000).
 * Meanwhile a prober asks `GET /healthz` back to back and records how long each answer took:
 * the longest is the most another request had to wait while the body was being handled.
 * Prints figures; asserts nothing.
 */
import { performance } from 'node:perf_hooks';
import { startBenchStack } from './support/bench-stack.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';

const ROWS = Number(process.env.BENCH_HOSTILE_ROWS ?? 100_000);
const T0 = Date.UTC(2026, 0, 1);

/** Posts `body` while probing /healthz; returns the post's time, status and answer size, and the probe latencies. */
async function postWhileProbing(appUrl: string, key: string, type: string, body: string) {
  let probing = true;
  const waits: number[] = [];
  const prober = (async () => {
    while (probing) {
      const t = performance.now();
      await (await fetch(`${appUrl}/healthz`)).arrayBuffer();
      waits.push(performance.now() - t);
    }
  })();
  const t0 = performance.now();
  const res = await fetch(`${appUrl}/api/v1/ingest`, { method: 'POST', headers: { authorization: `Bearer ${key}`, 'content-type': type }, body });
  const text = await res.text();
  const seconds = (performance.now() - t0) / 1000;
  probing = false;
  await prober;
  waits.sort((a, b) => a - b);
  return {
    seconds,
    status: res.status,
    answerBytes: text.length,
    text,
    probes: waits.length,
    p50: waits[Math.floor(waits.length / 2)] ?? NaN,
    max: waits.at(-1) ?? NaN,
  };
}

function report(name: string, readings: number, r: Awaited<ReturnType<typeof postWhileProbing>>) {
  const rate = readings / r.seconds;
  console.log(
    `${name}: ${r.status} in ${r.seconds.toFixed(2)} s (${Math.round(rate).toLocaleString('en')} lines/s), answer ${r.answerBytes.toLocaleString('en')} bytes; ` +
      `/healthz during it: ${r.probes} answers, median ${r.p50.toFixed(1)} ms, longest ${r.max.toFixed(1)} ms`,
  );
}

async function main() {
  const stack = await startBenchStack();
  try {
    const lab = await labsRepo(stack.db).insert({ slug: 'bench-hostile', name: 'Bench lab' });
    await onLargestPlan(stack.db, lab.id);
    const service = createLoggersService({ db: stack.db });
    const { issued } = await service.register({ ...lab, role: 'admin' as const }, null, {
      name: 'Bench logger',
      timezone: 'UTC',
      expectedIntervalS: 1,
      channels: [{ key: 'air_t', label: 'Air' }],
    });
    const csv = `channel,ts,value\n${Array.from({ length: ROWS }, (_, i) => `air_t,${T0 + i * 1000},${(i % 997) / 10}`).join('\n')}\n`;
    const json = JSON.stringify({
      readings: Array.from({ length: ROWS }, (_, i) => ({ channel: 'air_t', ts: T0 + ROWS * 1000 + i * 1000, value: (i % 997) / 10 })),
    });
    const bad = `channel,ts,value\n${'a\n'.repeat(1_000_000)}`;
    // warm-up, untimed: a small batch
    await fetch(`${stack.appUrl}/api/v1/ingest`, {
      method: 'POST',
      headers: { authorization: `Bearer ${issued.key}`, 'content-type': 'text/csv' },
      body: 'channel,ts,value\nair_t,1000,1\n',
    });
    const idle = await postWhileProbing(stack.appUrl, issued.key, 'text/csv', 'channel,ts,value\n');
    console.log(`idle: /healthz median ${idle.p50.toFixed(1)} ms`);
    report(
      `good CSV, ${ROWS.toLocaleString('en')} readings (${(csv.length / 1e6).toFixed(1)} MB)`,
      ROWS,
      await postWhileProbing(stack.appUrl, issued.key, 'text/csv', csv),
    );
    report(
      `good JSON, ${ROWS.toLocaleString('en')} readings (${(json.length / 1e6).toFixed(1)} MB)`,
      ROWS,
      await postWhileProbing(stack.appUrl, issued.key, 'application/json', json),
    );
    const hostile = await postWhileProbing(stack.appUrl, issued.key, 'text/csv', bad);
    report('hostile CSV, 1,000,000 one-field lines (2 MB)', 1_000_000, hostile);
    console.log(`  answer: ${hostile.text.slice(0, 160)}…`);
  } finally {
    await stack.stop();
  }
}

await main();
