/**
 * `npm run bench:storage` — what a reading costs on disk, today's schema against the new one
 * (issue #20), in one run on one throw-away MariaDB server.
 *
 * 1. Starts a private MariaDB (docker-free-scripts/mariadb.sh: temporary data folder, free port on
 *    127.0.0.1; zlib page compression), so the `.ibd` files' allocated bytes and mariadbd's CPU
 *    time can be read from outside (stat blocks × 512, /proc/<pid>/stat).
 * 2. Generates seeded one-minute readings: `--channels` (20) channels × `--days` (365) days, each a
 *    daily and a yearly cycle plus AR(1) noise (φ 0.8), rounded to 2–3 decimals
 *    (support/storage-data.ts). Batches of 250 minutes of every channel (5,000 rows at 20).
 * 3. "today": the tables as of commit c9ea3ba, loaded with the statements ingestion wrote then
 *    (LOAD DATA of the readings and the upsert of minute, hour and day rollups, one transaction a
 *    batch). "new": every migration of the tree, a lab, a logger and its channels (60 s), the
 *    readings stored through `ingestBatch` (the API's path), then the background rebuild of closed
 *    months.
 * 4. Prints, side by side: rows; bytes per reading (data + index after ANALYZE TABLE, and on
 *    disk) for readings, rollups and both; MariaDB CPU seconds per million readings for the load
 *    and the rebuild; load time; a year of one channel read raw and as a 2,000-point series;
 *    usage reconciliation; dropping the first month (DELETE today, DROP PARTITION new).
 *
 * `--compare-lz4` measures InnoDB page compression with zlib against lz4 instead: the "new" load
 * (and rebuild) on two servers one after the other, same data (use a smaller `--days`). It installs
 * Debian's mariadb-plugin-provider-lz4 with apt-get when missing.
 *
 * Reports; asserts nothing (exit 1 only on an error). Read figures are medians after a warm-up
 * read. Everything runs on 127.0.0.1 and is removed at the end.
 */
import { spawnSync } from 'node:child_process';
import { median } from './bench-helpers.ts';
import { dataShape, DAY_MS, readingBatches, type StorageDataOptions } from './support/storage-data.ts';
import { startStorageServer, type StorageServer } from './support/storage-server.ts';
import { createTodaySchema } from './support/storage-today-schema.ts';
import { createNewSchema } from './support/storage-new-schema.ts';
import { measureStorage, perReading, type StorageCost } from './support/storage-sizes.ts';
import { rebuildClosedMonths, type RebuildOutcome } from './support/storage-rebuild.ts';
import { dropPartition, listPartitions, monthPartitionName, nextMonthStart, PARTITIONED_TABLES } from '../../server/db/reading-partitions.ts';

const TARGET_BYTES_PER_READING = 16;
const DATABASE = 'lagbook_storage';
const TODAY_DATABASE = 'lagbook_storage_today';
/** The readings lie in a year still to come, so the month partitions made ahead receive them (see storage-new-schema.ts). */
const START_MS = Date.UTC(2027, 0, 1);

interface Args extends StorageDataOptions {
  compareLz4: boolean;
}

function parseArgs(argv: string[]): Args {
  const args: Args = { channels: 20, days: 365, seed: 20261204, startMs: START_MS, compareLz4: false };
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i];
    const int = (name: string, min: number, max: number) => {
      const v = Number(argv[++i]);
      if (!Number.isInteger(v) || v < min || v > max) throw new Error(`${name} takes a whole number from ${min} to ${max} (got ${argv[i]})`);
      return v;
    };
    if (flag === '--channels') args.channels = int('--channels', 1, 200);
    else if (flag === '--days') args.days = int('--days', 1, 730);
    else if (flag === '--seed') args.seed = int('--seed', 0, 2 ** 32 - 1);
    else if (flag === '--compare-lz4') args.compareLz4 = true;
    else throw new Error(`unknown option ${flag} (known: --channels N, --days N, --seed N, --compare-lz4)`);
  }
  return args;
}

/** Median wall time in ms of `fn` over `runs` runs after one untimed run (which also checks the answer). */
async function medianMs(fn: () => Promise<unknown>, runs: number): Promise<number> {
  await fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    await fn();
    times.push(performance.now() - t);
  }
  return median(times);
}

/**
 * Wall seconds of `fn`, then mariadbd's CPU seconds for it including the writing of the pages it
 * dirtied (page compression is paid when a page is written to its file, so the phase ends only
 * when the buffer pool holds no dirty page; that wait is `flushS`, apart from the wall time).
 */
async function phase<T>(srv: StorageServer, fn: () => Promise<T>): Promise<{ value: T; wallS: number; flushS: number; dbCpuS: number; benchCpuS: number }> {
  await srv.flushDirtyPages();
  const cpu0 = srv.cpuSeconds();
  const bench0 = process.cpuUsage();
  const t0 = performance.now();
  const value = await fn();
  const t1 = performance.now();
  const bench = process.cpuUsage(bench0);
  await srv.flushDirtyPages();
  return {
    value,
    wallS: (t1 - t0) / 1000,
    flushS: (performance.now() - t1) / 1000,
    dbCpuS: srv.cpuSeconds() - cpu0,
    benchCpuS: (bench.user + bench.system) / 1e6,
  };
}

/**
 * Repacks both tables of `database` with `ALTER TABLE … FORCE, ALGORITHM=INPLACE, LOCK=NONE` (an
 * online sorted rebuild of every partition, the method the issue measured 13.7 B/reading with), as
 * a reference for what the maintenance job's month rebuild could reach.
 */
async function forceRebuild(srv: StorageServer, database: string): Promise<{ wallS: number; flushS: number; dbCpuS: number; after: StorageCost }> {
  const force = await phase(srv, async () => {
    for (const table of ['readings', 'reading_rollups'])
      await srv.server.asRoot(`ALTER TABLE \`${database}\`.\`${table}\` FORCE, ALGORITHM=INPLACE, LOCK=NONE`);
  });
  return { wallS: force.wallS, flushS: force.flushS, dbCpuS: force.dbCpuS, after: await measureStorage(srv, database) };
}

interface SchemaFigures {
  readings: number;
  load: { wallS: number; flushS: number; dbCpuS: number; benchCpuS: number };
  afterLoad: StorageCost;
  rebuild?: { outcome: RebuildOutcome; wallS: number; flushS: number; dbCpuS: number; after: StorageCost };
  forced?: { wallS: number; flushS: number; dbCpuS: number; after: StorageCost };
  rawReadMs: number;
  rawReadRows: number;
  seriesMs: number;
  seriesPoints: number;
  usageMs: number;
  usageCount: number;
  dropMonth: { what: string; seconds: number; rows: string; allocatedBefore: number; allocatedAfter: number };
}

const allocatedOf = (c: StorageCost) => c.readings.files.allocated + c.reading_rollups.files.allocated;

async function runToday(srv: StorageServer, args: Args): Promise<SchemaFigures> {
  const today = await createTodaySchema(srv.socketPath, TODAY_DATABASE, args.channels);
  try {
    const load = await phase(srv, async () => {
      let stored = 0;
      for (const batch of readingBatches(args)) stored += await today.store(batch);
      return stored;
    });
    const afterLoad = await measureStorage(srv, TODAY_DATABASE);
    const { from, to, channelId } = readWindow(args, today.channelIds);
    let rawReadRows = 0;
    const rawReadMs = await medianMs(async () => (rawReadRows = await today.rawRange(channelId, from, to)), 3);
    let seriesPoints = 0;
    const seriesMs = await medianMs(async () => (seriesPoints = await today.series(channelId, from, to, 2000)), 5);
    let usageCount = 0;
    const usageMs = await medianMs(async () => (usageCount = await today.storedReadings()), 5);
    const month = { from: args.startMs, to: nextMonthStart(args.startMs) };
    const before = await measureStorage(srv, TODAY_DATABASE);
    const t0 = performance.now();
    const deleted = await today.deleteRange(month.from, month.to);
    const seconds = (performance.now() - t0) / 1000;
    const after = await measureStorage(srv, TODAY_DATABASE);
    await srv.server.asRoot(`DROP DATABASE \`${TODAY_DATABASE}\``);
    return {
      readings: load.value,
      load,
      afterLoad,
      rawReadMs,
      rawReadRows,
      seriesMs,
      seriesPoints,
      usageMs,
      usageCount,
      dropMonth: {
        what: `DELETE of ${monthPartitionName(month.from)}`,
        seconds,
        rows: `${deleted.readings.toLocaleString('en')} readings, ${deleted.rollups.toLocaleString('en')} rollups`,
        allocatedBefore: allocatedOf(before),
        allocatedAfter: allocatedOf(after),
      },
    };
  } finally {
    await today.close();
  }
}

/** A year (or the whole run) of the first channel, the window both schemas read. */
function readWindow(args: Args, channelIds: number[]): { from: number; to: number; channelId: number } {
  const { minutes } = dataShape(args);
  return { from: args.startMs, to: args.startMs + Math.min(minutes * 60_000, 365 * DAY_MS), channelId: channelIds[0] };
}

async function runNew(srv: StorageServer, args: Args, database: string, withReads: boolean): Promise<SchemaFigures> {
  const { minutes } = dataShape(args);
  const lastReadingMs = args.startMs + (minutes - 1) * 60_000;
  const fresh = await createNewSchema(srv.socketPath, database, args.channels, lastReadingMs);
  try {
    if (!fresh.partitioned) console.log('  note: readings is not partitioned after the migrations of this tree');
    const load = await phase(srv, async () => {
      let stored = 0;
      for (const batch of readingBatches(args)) stored += await fresh.store(batch);
      return stored;
    });
    const afterLoad = await measureStorage(srv, database);
    // the job rebuilds months that closed more than a day ago
    const rebuildAt = lastReadingMs + 2 * DAY_MS + 60_000;
    const rebuildPhase = await phase(srv, () => rebuildClosedMonths(fresh, rebuildAt));
    const rebuild = {
      outcome: rebuildPhase.value,
      wallS: rebuildPhase.wallS,
      flushS: rebuildPhase.flushS,
      dbCpuS: rebuildPhase.dbCpuS,
      after: await measureStorage(srv, database),
    };
    const figures: SchemaFigures = {
      readings: load.value,
      load,
      afterLoad,
      rebuild,
      rawReadMs: Number.NaN,
      rawReadRows: 0,
      seriesMs: Number.NaN,
      seriesPoints: 0,
      usageMs: Number.NaN,
      usageCount: 0,
      dropMonth: { what: 'not run', seconds: Number.NaN, rows: '', allocatedBefore: 0, allocatedAfter: 0 },
    };
    if (!withReads) return figures;
    const { from, to, channelId } = readWindow(args, fresh.channelIds);
    fresh.setNow(rebuildAt);
    figures.rawReadMs = await medianMs(async () => (figures.rawReadRows = await fresh.rawRange(channelId, from, to)), 3);
    figures.seriesMs = await medianMs(async () => (figures.seriesPoints = await fresh.series(channelId, from, to, 2000)), 5);
    figures.usageMs = await medianMs(async () => (figures.usageCount = await fresh.storedReadings()), 5);
    figures.forced = await forceRebuild(srv, database);
    if (fresh.partitioned) {
      const name = monthPartitionName(args.startMs);
      const rows = (await listPartitions(fresh.db, 'readings')).find((p) => p.name === name)?.approxRows ?? 0;
      const before = await measureStorage(srv, database);
      const each: string[] = [];
      let seconds = 0;
      for (const table of PARTITIONED_TABLES) {
        const t0 = performance.now();
        await dropPartition(fresh.db, table, name);
        const s = (performance.now() - t0) / 1000;
        each.push(`${table} ${(s * 1000).toFixed(0)} ms`);
        seconds += s;
      }
      const after = await measureStorage(srv, database);
      figures.dropMonth = {
        what: `DROP PARTITION ${name} (${each.join(', ')})`,
        seconds,
        rows: `≈ ${rows.toLocaleString('en')} readings (InnoDB's estimate)`,
        allocatedBefore: allocatedOf(before),
        allocatedAfter: allocatedOf(after),
      };
    }
    return figures;
  } finally {
    await fresh.close();
  }
}

const mb = (b: number) => `${(b / 1e6).toFixed(1)} MB`;
const bpr = (b: number, n: number) => perReading(b, n).toFixed(1);
const perMillion = (s: number, n: number) => ((s / n) * 1e6).toFixed(2);

/** Prints the figures of each column side by side, one line a figure. */
function printTable(columns: Array<{ title: string; cells: Record<string, string> }>): void {
  const labels = [...new Set(columns.flatMap((c) => Object.keys(c.cells)))];
  const labelWidth = Math.max(...labels.map((l) => l.length));
  const widths = columns.map((c) => Math.max(c.title.length, ...Object.values(c.cells).map((v) => v.length)));
  console.log(`${''.padEnd(labelWidth)} | ${columns.map((c, i) => c.title.padStart(widths[i])).join(' | ')}`);
  for (const label of labels) console.log(`${label.padEnd(labelWidth)} | ${columns.map((c, i) => (c.cells[label] ?? '—').padStart(widths[i])).join(' | ')}`);
}

/** The size lines of one column: rows, bytes per reading (data + index, on disk) per table and in total. */
function sizeCells(cost: StorageCost, readings: number): Record<string, string> {
  const r = cost.readings;
  const u = cost.reading_rollups;
  return {
    'rows: readings': r.rows.toLocaleString('en'),
    'rows: reading_rollups': u.rows.toLocaleString('en'),
    'B/reading, readings, data + index': bpr(r.dataIndex, readings),
    'B/reading, rollups, data + index': bpr(u.dataIndex, readings),
    'B/reading, total, data + index': bpr(r.dataIndex + u.dataIndex, readings),
    'B/reading, readings, on disk': bpr(r.files.allocated, readings),
    'B/reading, rollups, on disk': bpr(u.files.allocated, readings),
    'B/reading, total, on disk': bpr(r.files.allocated + u.files.allocated, readings),
    'on disk, total (apparent file size)': `${mb(r.files.allocated + u.files.allocated)} (${mb(r.files.apparent + u.files.apparent)})`,
  };
}

function loadCells(f: SchemaFigures): Record<string, string> {
  return {
    'load: wall time (then writing dirty pages)': `${f.load.wallS.toFixed(1)} s (${Math.round(f.readings / f.load.wallS).toLocaleString('en')} readings/s), ${f.load.flushS.toFixed(1)} s`,
    'load: MariaDB CPU s per 10⁶ readings': perMillion(f.load.dbCpuS, f.readings),
    'load: Node CPU s per 10⁶ (today: the loader; new: ingestBatch)': perMillion(f.load.benchCpuS, f.readings),
  };
}

function readCells(f: SchemaFigures): Record<string, string> {
  return {
    'a year of one channel, raw': `${f.rawReadMs.toFixed(0)} ms (${f.rawReadRows.toLocaleString('en')} rows)`,
    'a year of one channel, 2,000-point series': `${f.seriesMs.toFixed(1)} ms (${f.seriesPoints} points)`,
    'usage reconciliation (stored readings)': `${f.usageMs.toFixed(1)} ms (${f.usageCount.toLocaleString('en')})`,
    'drop the first month': `${(f.dropMonth.seconds * 1000).toFixed(0)} ms: ${f.dropMonth.what}`,
    'drop the first month: rows': f.dropMonth.rows,
    'drop the first month: on disk before → after': `${mb(f.dropMonth.allocatedBefore)} → ${mb(f.dropMonth.allocatedAfter)}`,
  };
}

function rebuildCells(f: SchemaFigures): Record<string, string> {
  const r = f.rebuild;
  if (!r) return {};
  if (!r.outcome.ran) return { rebuild: `not run: ${r.outcome.note}` };
  return {
    rebuild: r.outcome.detail,
    'rebuild: wall time (then writing dirty pages)': `${r.wallS.toFixed(1)} s, ${r.flushS.toFixed(1)} s`,
    'rebuild: MariaDB CPU s per 10⁶ readings': perMillion(r.dbCpuS, f.readings),
  };
}

function gitCommit(): string {
  const head = spawnSync('git', ['rev-parse', '--short', 'HEAD'], { encoding: 'utf8' }).stdout.trim();
  const dirty = spawnSync('git', ['status', '--porcelain', '--untracked-files=no'], { encoding: 'utf8' }).stdout.trim() ? ' (with uncommitted changes)' : '';
  return `${head}${dirty}`;
}

async function compareSchemas(args: Args): Promise<void> {
  const srv = await startStorageServer(DATABASE, 'zlib');
  try {
    console.log('today (c9ea3ba): loading…');
    const today = await runToday(srv, args);
    console.log('new: migrating and storing through ingestBatch…');
    const fresh = await runNew(srv, args, DATABASE, true);
    console.log('');
    const newAfter = fresh.rebuild?.outcome.ran ? fresh.rebuild.after : fresh.afterLoad;
    printTable([
      { title: 'today (c9ea3ba)', cells: { ...sizeCells(today.afterLoad, today.readings), ...loadCells(today), ...readCells(today) } },
      { title: 'new, as loaded', cells: { ...sizeCells(fresh.afterLoad, fresh.readings), ...loadCells(fresh) } },
      {
        title: 'new, after the rebuild',
        cells: fresh.rebuild?.outcome.ran
          ? { ...sizeCells(fresh.rebuild.after, fresh.readings), ...rebuildCells(fresh), ...readCells(fresh) }
          : { ...rebuildCells(fresh), ...readCells(fresh) },
      },
      ...(fresh.forced
        ? [
            {
              title: 'new, then ALTER … FORCE (reference)',
              cells: {
                ...sizeCells(fresh.forced.after, fresh.readings),
                'ALTER … FORCE: wall time (then writing dirty pages)': `${fresh.forced.wallS.toFixed(1)} s, ${fresh.forced.flushS.toFixed(1)} s`,
                'ALTER … FORCE: MariaDB CPU s per 10⁶ readings': perMillion(fresh.forced.dbCpuS, fresh.readings),
              },
            },
          ]
        : []),
    ]);
    console.log('');
    const total = perReading(newAfter.readings.files.allocated + newAfter.reading_rollups.files.allocated, fresh.readings);
    const which = fresh.rebuild?.outcome.ran ? 'after rebuild' : 'as loaded (no rebuild ran)';
    console.log(
      `target: total on disk ${which} ≤ ${TARGET_BYTES_PER_READING} B/reading: ${total <= TARGET_BYTES_PER_READING ? 'met' : 'not met'} (${total.toFixed(1)})`,
    );
    console.log(
      'note: "today" times only the two statements its ingestion wrote per batch (LOAD DATA, rollup upsert); "new" runs the whole batch transaction (logger lock, channel state, usage row, counters).',
    );
  } finally {
    await srv.server.destroy();
  }
}

/** Installs Debian's lz4 provider plugin for MariaDB when missing, as docker-free-scripts/lib.sh's apt_install does. */
function ensureLz4Provider(): void {
  const pkg = 'mariadb-plugin-provider-lz4';
  const status = spawnSync('dpkg-query', ['-W', '-f=${Status}', pkg], { encoding: 'utf8' }).stdout;
  if (status.includes('install ok installed')) return;
  console.log(`installing ${pkg} (apt-get)…`);
  const sudo = process.getuid?.() === 0 ? [] : ['sudo'];
  const run = (cmd: string[]) => {
    const r = spawnSync(sudo.length ? 'sudo' : cmd[0], sudo.length ? cmd : cmd.slice(1), {
      stdio: ['ignore', 'ignore', 'inherit'],
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    if (r.status !== 0) throw new Error(`${cmd.join(' ')} failed`);
  };
  run(['apt-get', 'update', '-q']);
  run(['apt-get', 'install', '-y', '-q', '--no-install-recommends', pkg]);
}

async function compareCompression(args: Args): Promise<void> {
  ensureLz4Provider();
  const columns: Array<{ title: string; cells: Record<string, string> }> = [];
  for (const algorithm of ['zlib', 'lz4'] as const) {
    console.log(`${algorithm}: starting a server and storing through ingestBatch…`);
    const srv = await startStorageServer(DATABASE, algorithm);
    try {
      const f = await runNew(srv, args, DATABASE, false);
      const forced = await forceRebuild(srv, DATABASE);
      const cost = f.rebuild?.outcome.ran ? f.rebuild.after : f.afterLoad;
      columns.push({
        title: `new, ${algorithm}`,
        cells: {
          ...sizeCells(f.afterLoad, f.readings),
          ...loadCells(f),
          ...rebuildCells(f),
          ...(f.rebuild?.outcome.ran
            ? { 'B/reading, total, on disk, after rebuild': bpr(cost.readings.files.allocated + cost.reading_rollups.files.allocated, f.readings) }
            : {}),
          'B/reading, readings, on disk, after ALTER … FORCE': bpr(forced.after.readings.files.allocated, f.readings),
          'B/reading, total, on disk, after ALTER … FORCE': bpr(
            forced.after.readings.files.allocated + forced.after.reading_rollups.files.allocated,
            f.readings,
          ),
          'ALTER … FORCE: wall time, MariaDB CPU s per 10⁶': `${forced.wallS.toFixed(1)} s, ${perMillion(forced.dbCpuS, f.readings)}`,
        },
      });
    } finally {
      await srv.server.destroy();
    }
  }
  console.log('');
  printTable(columns);
}

async function main() {
  const args = parseArgs(process.argv.slice(2));
  const shape = dataShape(args);
  console.log(
    `bench:storage on ${gitCommit()}: ${args.channels} channels × ${args.days} days of one-minute readings = ${shape.rows.toLocaleString('en')} readings in ${shape.batches.toLocaleString('en')} batches (seed ${args.seed})`,
  );
  if (args.compareLz4) await compareCompression(args);
  else await compareSchemas(args);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
