/**
 * `npm run bench:ingest` — end-to-end ingestion rate on loopback.
 *
 * 1. Posts 1,000,000 readings through POST /api/v1/ingest (JSON, batches of 5,000, several
 *    loggers in parallel, each logger sequential like a real one) and prints readings/s. Before
 *    that, untimed, BENCH_WARMUP_BATCHES (default 4) batches per logger warm the server up.
 * 2. Loads the same rows with MariaDB's LOAD DATA LOCAL INFILE (5,000-row chunks, from a
 *    generated stream) into an identical table and prints that rate and the ratio. Both the app
 *    and this load reach MariaDB through its Unix socket, as `npm start` runs it.
 * 3. Uploads a generated CSV file of BENCH_UPLOAD_MB megabytes (default 200) through the
 *    streaming upload route and prints the server's resident memory before, at peak and after.
 * Reports; asserts nothing. Everything runs on 127.0.0.1 and stops by itself.
 */
import { readFileSync } from 'node:fs';
import http from 'node:http';
import { Readable } from 'node:stream';
import mysql from 'mysql2/promise';
import { startBenchStack } from './support/bench-stack.ts';
import { processCpuSeconds } from './support/process-cpu.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { labsRepo } from '../../server/db/labs.repo.ts';
import { createLoggersService } from '../../server/services/loggers.service.ts';

const TOTAL = Number(process.env.BENCH_READINGS ?? 1_000_000);
const BATCH = 5000;
const LOGGERS = Number(process.env.BENCH_LOGGERS ?? 8);
const CHANNELS = 4;
const UPLOAD_MB = Number(process.env.BENCH_UPLOAD_MB ?? 200);
const T0 = Date.UTC(2026, 0, 1);
const WARMUP_BATCHES = Number(process.env.BENCH_WARMUP_BATCHES ?? 4);

/** Logger `l`'s batch number `b`: CHANNELS channels (by index), one reading a second from `t0`. */
function batchReadings(l: number, b: number, t0: number): Array<{ c: number; ts: number; value: number }> {
  const readings = [];
  for (let i = 0; i < BATCH / CHANNELS; i++) {
    const ts = t0 + (b * (BATCH / CHANNELS) + i) * 1000;
    for (let c = 0; c < CHANNELS; c++) readings.push({ c, ts, value: Math.round(Math.sin(ts / 3.6e6 + l + c) * 1e4) / 100 });
  }
  return readings;
}

/** The same batch as a JSON ingest body. */
function batchBody(l: number, b: number, t0: number): string {
  return JSON.stringify({ readings: batchReadings(l, b, t0).map((r) => ({ channel: `c${r.c}`, ts: r.ts, value: r.value })) });
}

function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : Number.NaN;
}

async function main() {
  const stack = await startBenchStack();
  try {
    const lab = await labsRepo(stack.db).insert({ slug: 'bench-lab', name: 'Bench lab' });
    await onLargestPlan(stack.db, lab.id);
    const ctx = { ...lab, role: 'admin' as const };
    const service = createLoggersService({ db: stack.db });
    const loggers: Array<{ key: string; channelIds: number[] }> = [];
    for (let l = 0; l < LOGGERS; l++) {
      const { logger, issued } = await service.register(ctx, null, {
        name: `Bench logger ${l}`,
        timezone: 'UTC',
        expectedIntervalS: 1,
        channels: Array.from({ length: CHANNELS }, (_, c) => ({ key: `c${c}`, label: `Channel ${c}` })),
      });
      loggers.push({ key: issued.key, channelIds: logger.channels.map((c) => c.id) });
    }

    if (TOTAL > 0) await measureApiAndLoadData(stack, lab, loggers);
    if (UPLOAD_MB > 0) await measureUpload(stack, lab, ctx, service);
  } finally {
    await stack.stop();
  }
}

async function measureApiAndLoadData(
  stack: Awaited<ReturnType<typeof startBenchStack>>,
  lab: { id: number },
  loggers: Array<{ key: string; channelIds: number[] }>,
) {
  {
    // Pre-build every batch body so that only sending and storing are timed.
    const perLogger = Math.floor(TOTAL / LOGGERS / BATCH);
    const bodies: string[][] = loggers.map((_, l) => Array.from({ length: perLogger }, (_, b) => batchBody(l, b, T0)));
    const sent = LOGGERS * perLogger * BATCH;
    // Each logger keeps one connection open, as a real logger would.
    const agent = new http.Agent({ keepAlive: true, maxSockets: LOGGERS });
    const postAll = (batches: string[][]) =>
      Promise.all(
        loggers.map(async (lg, l) => {
          const outcomes: Array<{ status: number; text: string }> = [];
          for (const body of batches[l]) outcomes.push(await postJson(agent, `${stack.appUrl}/api/v1/ingest`, lg.key, body));
          return outcomes;
        }),
      );
    // Warm-up, not timed: a few batches per logger a year before the measured ones, so the server's
    // JIT and MariaDB's buffer pool are warm as in a running deployment (common practice).
    const warmup = loggers.map((_, l) => Array.from({ length: WARMUP_BATCHES }, (_, b) => batchBody(l, b, T0 - 365 * 86_400_000)));
    const warmed = (await postAll(warmup)).flat();
    if (warmed.some((r) => r.status !== 200)) throw new Error(`warm-up batch refused: ${warmed.find((r) => r.status !== 200)!.text}`);
    let accepted = 0;
    let failures = 0;
    const cpuBefore = { app: processCpuSeconds(stack.app.pid!), db: processCpuSeconds(stack.dbPid), bench: process.cpuUsage() };
    const started = performance.now();
    for (const res of (await postAll(bodies)).flat()) {
      if (res.status !== 200) failures++;
      else accepted += (JSON.parse(res.text) as { accepted: number }).accepted;
    }
    const apiSeconds = (performance.now() - started) / 1000;
    const apiRate = sent / apiSeconds;
    const benchCpu = process.cpuUsage(cpuBefore.bench);
    console.log(
      `POST /api/v1/ingest: ${sent.toLocaleString('en')} readings (${LOGGERS} loggers × ${CHANNELS} channels, batches of ${BATCH}) in ${apiSeconds.toFixed(2)} s → ${Math.round(apiRate).toLocaleString('en')} readings/s (accepted ${accepted.toLocaleString('en')}, failed batches ${failures})`,
    );
    // CPU each process spent on it: on a 2-core machine the sum over wall time shows how close to saturation the run was.
    const cpu = {
      app: processCpuSeconds(stack.app.pid!) - cpuBefore.app,
      db: processCpuSeconds(stack.dbPid) - cpuBefore.db,
      bench: (benchCpu.user + benchCpu.system) / 1e6,
    };
    console.log(
      `  CPU seconds: app ${cpu.app.toFixed(2)}, MariaDB ${cpu.db.toFixed(2)}, benchmark client ${cpu.bench.toFixed(2)} (${((cpu.app + cpu.db + cpu.bench) / apiSeconds).toFixed(2)} cores busy on average)`,
    );

    // The same rows through LOAD DATA LOCAL INFILE into an identical table.
    await stack.db.raw('CREATE TABLE readings_load_copy LIKE readings');
    // over the same Unix socket as the app, so both rates pay the same transport
    const conn = await mysql.createConnection({
      socketPath: stack.dbConfig.socketPath,
      user: 'lagbook',
      password: 'lagbook',
      database: stack.dbConfig.database,
      flags: ['+LOCAL_FILES'],
    });
    const chunks: Buffer[] = [];
    for (let l = 0; l < LOGGERS; l++) {
      for (let b = 0; b < perLogger; b++) {
        let tsv = '';
        for (const r of batchReadings(l, b, T0)) tsv += `${lab.id}\t${loggers[l].channelIds[r.c]}\t${r.ts}\t${r.value}\n`;
        chunks.push(Buffer.from(tsv));
      }
    }
    const loadStart = performance.now();
    for (const chunk of chunks) {
      await conn.query({
        sql: "LOAD DATA LOCAL INFILE 'readings.tsv' IGNORE INTO TABLE readings_load_copy FIELDS TERMINATED BY '\\t' (tenant_id, channel_id, ts, value)",
        infileStreamFactory: () => Readable.from([chunk]),
      });
    }
    const loadSeconds = (performance.now() - loadStart) / 1000;
    const loadRate = sent / loadSeconds;
    await conn.end();
    console.log(`LOAD DATA LOCAL INFILE (same rows, ${BATCH}-row chunks): ${loadSeconds.toFixed(2)} s → ${Math.round(loadRate).toLocaleString('en')} rows/s`);
    console.log(`ratio API / LOAD DATA: ${(apiRate / loadRate).toFixed(2)} (target ≥ 0.35); API rate target ≥ 150,000 readings/s`);
  }
}

/**
 * POSTs a JSON body with node:http. The load generator shares the machine's two cores with the
 * server and the database, so it uses the leanest client Node has (fetch took about twice
 * the CPU for the same requests); loggers in the field run on their own hardware.
 */
function postJson(agent: http.Agent, url: string, key: string, body: string): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      url,
      { method: 'POST', agent, headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } },
      (res) => {
        const parts: Buffer[] = [];
        res.on('data', (b: Buffer) => parts.push(b));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(parts).toString() }));
        res.on('error', reject);
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

async function measureUpload(
  stack: Awaited<ReturnType<typeof startBenchStack>>,
  lab: { id: number; slug: string },
  ctx: Parameters<ReturnType<typeof createLoggersService>['register']>[0],
  service: ReturnType<typeof createLoggersService>,
) {
  // Memory while a large file streams in.
  {
    const { logger, issued: _ } = await service.register(ctx, null, {
      name: 'Upload target',
      timezone: 'UTC',
      expectedIntervalS: 60,
      channels: [{ key: 'u', label: 'Uploaded' }],
    });
    const targetBytes = UPLOAD_MB * 1024 * 1024;
    let produced = 0;
    let line = 0;
    const file = Readable.from(
      (function* () {
        yield Buffer.from('channel,ts,value\n');
        while (produced < targetBytes) {
          let block = '';
          for (let i = 0; i < 2000; i++, line++) block += `u,${T0 + line * 1000},${(line % 1000) / 10}\n`;
          produced += block.length;
          yield Buffer.from(block);
        }
      })(),
    );
    const pid = stack.app.pid!;
    const before = rssMb(pid);
    let peak = before;
    const sampler = setInterval(() => (peak = Math.max(peak, rssMb(pid))), 200);
    const options = encodeURIComponent(JSON.stringify({ format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' }));
    // a session-less request cannot pass the lab guard; the bench measures the import itself, so it calls
    // the upload route through a signed-in session made like the API tests do
    const cookie = await sessionCookie(stack, lab.id);
    const upStart = performance.now();
    const res = await fetch(`${stack.appUrl}/api/v1/labs/${lab.slug}/loggers/${logger.id}/uploads?options=${options}`, {
      method: 'POST',
      headers: { 'content-type': 'text/csv', cookie, origin: stack.appUrl },
      body: Readable.toWeb(file) as ReadableStream,
      duplex: 'half',
    } as RequestInit);
    let text: string;
    try {
      text = await res.text();
    } catch (err) {
      clearInterval(sampler);
      console.log(`upload of ${UPLOAD_MB} MB failed: ${(err as Error).message}; server RSS before ${before.toFixed(0)} MB, peak ${peak.toFixed(0)} MB`);
      return;
    }
    clearInterval(sampler);
    const summary = JSON.parse(text.trim().split('\n').at(-1)!);
    const upSeconds = (performance.now() - upStart) / 1000;
    console.log(
      `upload of ${UPLOAD_MB} MB (${summary.readings?.toLocaleString('en')} readings, ${summary.accepted?.toLocaleString('en')} stored) in ${upSeconds.toFixed(1)} s; ` +
        `server RSS before ${before.toFixed(0)} MB, peak ${peak.toFixed(0)} MB, after ${rssMb(pid).toFixed(0)} MB`,
    );
  }
}

async function sessionCookie(stack: Awaited<ReturnType<typeof startBenchStack>>, labId: number): Promise<string> {
  const { buildUser, sessionCookieFor } = await import('../support/factories.ts');
  const user = await buildUser(stack.db);
  await stack.db('memberships').insert({ tenant_id: labId, user_id: user.id, role: 'technician' });
  return sessionCookieFor(stack.db, 'bench-secret-bench-secret-bench-secret', user.id);
}

void main();
