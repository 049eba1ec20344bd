/**
 * How long reading an ingest body holds the thread at a time (issue 15, finding 1), without a
 * database: `npx tsx tests/bench/ingest-body-slices.bench.ts`. For a good CSV and JSON body of
 * BENCH_HOSTILE_ROWS readings (default 100,000) and the hostile CSV of issue 15, prints the total
 * time and the longest stretch between two pauses of `readingsFromCsvBody` / `readingsFromJsonBody`
 * (each pause lets other requests run), next to reading the same body in one go the way the
 * route did before (csv-parse's sync parser, JSON.parse of the whole body). Best of 5 runs.
 * Prints figures; asserts nothing.
 */
import { performance } from 'node:perf_hooks';
import { parse } from 'csv-parse/sync';
import { readingsFromCsvBody, readingsFromJsonBody } from '../../server/services/ingest/readings-from-body.ts';

const ROWS = Number(process.env.BENCH_HOSTILE_ROWS ?? 100_000);
const T0 = Date.UTC(2026, 0, 1);
const csv = `channel,ts,value\n${Array.from({ length: ROWS }, (_, i) => `air_t,${T0 + i * 1000},${(i % 997) / 10}`).join('\n')}\n`;
const json = Buffer.from(
  JSON.stringify({ readings: Array.from({ length: ROWS }, (_, i) => ({ channel: 'air_t', ts: T0 + i * 1000, value: (i % 997) / 10 })) }),
);
const bad = `channel,ts,value\n${'a\n'.repeat(1_000_000)}`;

/** Runs `read` with a pause that measures each synchronous stretch; returns total and longest stretch (ms). */
async function sliced(read: (pause: () => Promise<void>) => Promise<unknown>) {
  let best = { total: Infinity, longest: Infinity, pauses: 0 };
  for (let run = 0; run < 5; run++) {
    let mark = performance.now();
    let longest = 0;
    let pauses = 0;
    let paused = 0;
    const pause = async () => {
      longest = Math.max(longest, performance.now() - mark);
      pauses++;
      const p = performance.now();
      await new Promise<void>((r) => setImmediate(r));
      paused += performance.now() - p;
      mark = performance.now();
    };
    const t0 = performance.now();
    await read(pause).catch(() => undefined);
    longest = Math.max(longest, performance.now() - mark);
    const total = performance.now() - t0 - paused;
    if (total < best.total) best = { total, longest, pauses };
  }
  return best;
}

function whole(read: () => unknown) {
  let best = Infinity;
  for (let run = 0; run < 5; run++) {
    const t0 = performance.now();
    try {
      read();
    } catch {
      /* refused bodies count too */
    }
    best = Math.min(best, performance.now() - t0);
    if (best > 20_000) break; // the hostile body: once is enough
  }
  return best;
}

const line = (name: string, s: { total: number; longest: number; pauses: number }, before: number) =>
  console.log(
    `${name}: ${s.total.toFixed(1)} ms of work in ${s.pauses + 1} slices, longest ${s.longest.toFixed(1)} ms — before: ${before.toFixed(1)} ms in one go`,
  );

line(
  `good CSV ${ROWS.toLocaleString('en')} rows`,
  await sliced((pause) => readingsFromCsvBody(csv, { pause })),
  whole(() => parse(csv, { relax_column_count: true, skip_empty_lines: true, bom: true, trim: true })),
);
line(
  `good JSON ${ROWS.toLocaleString('en')} rows`,
  await sliced((pause) => readingsFromJsonBody(json, { pause })),
  whole(() => JSON.parse(json.toString('utf8'))),
);
const badSmall = `channel,ts,value\n${'a\n'.repeat(20_000)}`;
line(
  'hostile CSV 1,000,000 one-field lines (old: 20,000 lines only)',
  await sliced((pause) => readingsFromCsvBody(bad, { pause })),
  whole(() => parse(badSmall, { relax_column_count: true, skip_empty_lines: true, bom: true, trim: true })),
);
