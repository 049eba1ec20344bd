import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { postBatch } from '../support/posting-logger.ts';
import { runOps } from '../support/run-ops.ts';
import { dropPartition, ensureMonthsFrom, listPartitions, monthPartitionName } from '../../server/db/reading-partitions.ts';
import { stagingTableName, storageRebuildsRepo } from '../../server/db/storage-rebuilds.repo.ts';
import { createStorageMaintenanceJob, STORAGE_LEASE } from '../../server/services/storage/storage-maintenance-job.ts';
import { createMonthRebuild, type RebuildStep } from '../../server/services/storage/month-rebuild.ts';
import type { LogWriter } from '../../server/log-writer.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { LagbookMigrationSource, migrationsDirectory } from '../../server/db/migration-source.ts';
import { buildLab, type TestLab } from '../support/factories.ts';
import { startPrivateMariaDb, type PrivateMariaDb } from '../support/private-mariadb.ts';
import { createLeaseRunner } from '../../server/jobs/job-lease.ts';

/**
 * The storage maintenance job against the real MariaDB (issue #20 item 2). Readings of past
 * months 2026 go in through the ingestion route and directly; the job runs with a simulated
 * clock and small batches (several batches per month), and "crashes" are thrown from its
 * `afterStep` hook. Every check compares the exact row sets of a month before and after — a
 * rebuild must change where the rows live, never which rows there are.
 */
let t: TestApp;
let url: string;
let A: LabWithEverything;
let B: LabWithEverything;
const NOW = new Date(Date.UTC(2026, 11, 4, 12));
/** A clock at which January and February 2026 are closed (a month closes a day after its end) and March is not. */
const MID_MARCH = new Date(Date.UTC(2026, 2, 10));
const BATCH = 700;
const lines: Array<{ level: string; msg: string }> = [];
const logger: LogWriter = {
  info: (msg) => void lines.push({ level: 'info', msg }),
  warn: (msg) => void lines.push({ level: 'warn', msg }),
  error: (msg) => void lines.push({ level: 'error', msg }),
};

const month = (m: number) => Date.UTC(2026, m, 1);
type Row = [number, number, number, number];

/**
 * The labs this file made: row sets are compared over them only, since other test files share the
 * database and may leave rows of labs deleted for good, which a rebuild rightly does not copy.
 */
const ownLabs: number[] = [];

/** Every row of the month of this file's labs, in key order. */
async function monthRows(m: number): Promise<Row[]> {
  const rows = (await t
    .db('readings')
    .whereIn('tenant_id', ownLabs)
    .where('ts', '>=', month(m))
    .where('ts', '<', month(m + 1))
    .orderBy(['tenant_id', 'channel_id', 'ts'])
    .select('tenant_id', 'channel_id', 'ts', 'value')) as Array<{
    tenant_id: number;
    channel_id: number;
    ts: number;
    value: number;
  }>;
  return rows.map((r) => [Number(r.tenant_id), Number(r.channel_id), Number(r.ts), Number(r.value)]);
}

/** `n` readings a minute apart from the month's start for one lab's channel, inserted as ingestion stores them. */
async function fill(lab: LabWithEverything, m: number, n: number, offsetMin = 0): Promise<void> {
  const rows = Array.from({ length: n }, (_, i) => ({
    tenant_id: lab.lab.id,
    channel_id: lab.ids.channelId,
    ts: month(m) + (offsetMin + i) * 60_000,
    value: Math.round(Math.sin(i / 50) * 1000) / 100,
  }));
  for (let i = 0; i < rows.length; i += 2000) await t.db('readings').insert(rows.slice(i, i + 2000));
}

/** Posts readings of month `m` through the ingestion route (must be acknowledged). */
async function post(lab: LabWithEverything, m: number, n: number, offsetMin: number): Promise<void> {
  const body = JSON.stringify({
    readings: Array.from({ length: n }, (_, i) => ({ channel: 'air_t', ts: month(m) + (offsetMin + i) * 60_000, value: 20 + i / 8 })),
  });
  const res = await postBatch(url, lab.ingestKey, body);
  expect(res.status, await res.clone().text()).toBe(200);
}

const spaceOf = (m: number) => storageRebuildsRepo(t.db).spaceId('readings', monthPartitionName(month(m)));
const recordOf = (m: number) => storageRebuildsRepo(t.db).get(month(m));

beforeAll(async () => {
  t = await buildTestApp();
  url = await t.listen();
  A = await buildLabWithEverything(t.db, { name: 'Cold-room lab' });
  B = await buildLabWithEverything(t.db, { name: 'Greenhouse lab' });
  ownLabs.push(A.lab.id, B.lab.id);
  // The fresh test database was partitioned from this month on; give 2026's past months their own partitions.
  for (const table of ['readings', 'reading_rollups'] as const) await ensureMonthsFrom(t.db, table, month(0));
}, 60_000);
afterAll(async () => t?.close());

describe('storage maintenance', () => {
  it('makes month partitions three months ahead on both tables, once', async () => {
    const job = createStorageMaintenanceJob({ db: t.db, logger, holder: 'test-a', now: () => new Date(Date.UTC(2027, 4, 20)) });
    const made = await job.ensureMonthsAhead();
    expect(made).toEqual(expect.arrayContaining(['readings.p202708', 'reading_rollups.p202708', 'readings.p202706']));
    expect(await job.ensureMonthsAhead()).toEqual([]);
    for (const table of ['readings', 'reading_rollups'] as const) {
      const parts = await listPartitions(t.db, table);
      const months = parts.filter((p) => p.kind === 'month').map((p) => p.name);
      expect(months[0]).toBe('p202601');
      expect(months[months.length - 1]).toBe('p202708');
      expect(parts[parts.length - 1].kind).toBe('future');
      // no gap, no overlap: each partition starts where the one before ends
      for (let i = 1; i < parts.length; i++) expect(parts[i].monthStart).toBe(parts[i - 1].monthEnd);
    }
  });

  it('rebuilds a closed month once with every row intact; readings posted between copy and swap are kept; a lab deleted meanwhile does not come back', async () => {
    const C = await buildLabWithEverything(t.db, { name: 'Closing lab' });
    ownLabs.push(C.lab.id);
    await fill(A, 1, 3000);
    await fill(B, 1, 1500);
    await fill(C, 1, 800);
    await post(A, 1, 200, 5000);
    const before = await monthRows(1);
    const spaceBefore = await spaceOf(1);
    let posted: Row[] = [];
    const job = createStorageMaintenanceJob({
      db: t.db,
      logger,
      holder: 'test-a',
      now: () => MID_MARCH,
      batchRows: BATCH,
      afterStep: async (step, name) => {
        if (step !== 'copied' || name !== 'p202602') return;
        // during the copy: a logger posts more of February, and lab C is deleted for good (its deletion
        // handed to the deletion job, which removes its rows) — as LabDeletionService.request does
        await post(B, 1, 300, 9000);
        posted = (await monthRows(1)).filter((r) => r[0] === B.lab.id && r[2] >= month(1) + 9000 * 60_000);
        await t.db('labs').where({ id: C.lab.id }).update({ deleted_at: new Date() });
        await t.db('lab_deletions').insert({
          lab_id: C.lab.id,
          lab_slug: C.lab.slug,
          lab_name: 'Closing lab',
          requested_by_name: 'Test',
          requested_by_email: 'test@lab.example',
          requested_at: new Date(),
          ready_at: new Date(),
          // recorded as finished so the deletion job of other test files (same database) leaves it alone
          finished_at: new Date(),
          rows_removed: '{}',
        });
        await t.db('readings').where({ tenant_id: C.lab.id }).delete();
      },
    });
    const summary = await job.runOnce();
    expect(summary.stopped).toBeNull();
    expect(summary.rebuilt).toEqual(['p202601', 'p202602']);
    expect(posted).toHaveLength(300);
    const after = await monthRows(1);
    const expected = [...before.filter((r) => r[0] !== C.lab.id), ...posted].sort((x, y) => x[0] - y[0] || x[1] - y[1] || x[2] - y[2]);
    expect(after).toEqual(expected);
    expect(after.some((r) => r[0] === C.lab.id)).toBe(false);
    // the month now lives in a different tablespace (the copy), and the staging table is gone
    expect(await spaceOf(1)).not.toBe(spaceBefore);
    expect(await t.db.schema.hasTable(stagingTableName('p202602'))).toBe(false);
    const record = await recordOf(1);
    expect(record).toMatchObject({ status: 'done', rowsCopied: 3000 + 200 + 1500 + 800, lastError: null });
    expect(record!.rowsPutBack).toBe(300);

    // a second run leaves a month already done alone
    const space = await spaceOf(1);
    const again = await job.runOnce();
    expect(again).toEqual({ monthsMade: [], rollupsSettled: 0, rebuilt: [], stopped: null });
    expect(await spaceOf(1)).toBe(space);
    expect(await monthRows(1)).toEqual(expected);
    // ingestion into the rebuilt month still works
    await post(A, 1, 10, 20_000);
    expect((await monthRows(1)).length).toBe(expected.length + 10);

    const progress = await job.progress();
    expect(progress.rebuilds.find((r) => r.partitionName === 'p202602')?.status).toBe('done');
    expect(progress.pending).toEqual([]);
  });

  const steps: RebuildStep[] = ['copy-batch', 'copied', 'exchanged', 'put-back-batch', 'put-back'];
  it.each(steps.map((s, i) => [s, i + 2] as const))('a crash after step %s resumes and ends with every row in readings (month %i of 2026)', async (step, m) => {
    await fill(A, m, 2500);
    await fill(B, m, 900);
    const before = await monthRows(m);
    const spaceBefore = await spaceOf(m);
    const name = monthPartitionName(month(m));
    let arrived: Row[] = [];
    let crashed = false;
    const crashing = createMonthRebuild({
      db: t.db,
      logger,
      now: () => NOW,
      batchRows: BATCH,
      afterStep: async (s, p) => {
        if (p !== name) return;
        if (s === 'copied') {
          await post(A, m, 50, 30_000);
          arrived = (await monthRows(m)).filter((r) => r[2] >= month(m) + 30_000 * 60_000);
        }
        if (s === step && !crashed) {
          crashed = true;
          throw new Error(`simulated crash after ${s}`);
        }
      },
    });
    await expect(crashing.rebuild(name)).rejects.toThrow('simulated crash');
    expect((await recordOf(m))?.lastError).toContain('simulated crash');
    // every row is in readings, or (only between swap and put-back) in the old partition kept aside
    const visible = await monthRows(m);
    const aside =
      (await t.db.schema.hasTable(stagingTableName(name))) && step !== 'copy-batch' && step !== 'copied'
        ? await t.db(stagingTableName(name)).count({ n: '*' })
        : [{ n: 0 }];
    expect(visible.length + Number(aside[0].n)).toBeGreaterThanOrEqual(before.length);

    const resumed = createMonthRebuild({ db: t.db, logger, now: () => NOW, batchRows: BATCH });
    expect(await resumed.rebuild(name)).toBe('rebuilt');
    const expected = [...before, ...arrived].sort((x, y) => x[0] - y[0] || x[1] - y[1] || x[2] - y[2]);
    if (step === 'copy-batch') expect(arrived).toEqual([]); // crashed before the posting point
    expect(await monthRows(m)).toEqual(expected);
    expect(await recordOf(m)).toMatchObject({ status: 'done', lastError: null });
    expect(await t.db.schema.hasTable(stagingTableName(name))).toBe(false);
    expect(await resumed.rebuild(name)).toBe('already-done');
    // the copy is what stays in place (a resume that missed the swap would have swapped the old partition back)
    expect(await spaceOf(m)).not.toBe(spaceBefore);
  });

  it('a lab only marked deleted while its request is under way keeps every reading (the request may yet reopen it)', async () => {
    const D = await buildLabWithEverything(t.db, { name: 'Wavering lab' });
    ownLabs.push(D.lab.id);
    const m = 9; // October 2026, closed at NOW
    await fill(D, m, 1200);
    await fill(A, m, 600);
    const before = await monthRows(m);
    const name = monthPartitionName(month(m));
    const rebuild = createMonthRebuild({
      db: t.db,
      logger,
      now: () => NOW,
      batchRows: BATCH,
      afterStep: async (s, p) => {
        // marked deleted during the copy, then reopened (a failing Stripe call withdraws the request)
        if (p === name && s === 'copy-batch') await t.db('labs').where({ id: D.lab.id }).update({ deleted_at: new Date() });
        if (p === name && s === 'exchanged') await t.db('labs').where({ id: D.lab.id }).update({ deleted_at: null });
      },
    });
    expect(await rebuild.rebuild(name)).toBe('rebuilt');
    expect(await monthRows(m)).toEqual(before);
  });

  it('a long transaction on readings: the swap gives up after a short wait, changes nothing, and the next try completes', async () => {
    await fill(B, 8, 1500);
    const before = await monthRows(8);
    const spaceBefore = await spaceOf(8);
    const rebuild = createMonthRebuild({ db: t.db, logger, now: () => NOW, batchRows: BATCH, exchange: { attempts: 2, lockWaitSeconds: 1, pauseMs: 100 } });
    // an open transaction that has read readings holds the table's metadata lock until it ends
    const trx = await t.db.transaction();
    try {
      await trx('readings').where({ tenant_id: B.lab.id }).first();
      await expect(rebuild.rebuild('p202609')).rejects.toThrow(/Lock wait timeout/);
    } finally {
      await trx.commit();
    }
    expect(await recordOf(8)).toMatchObject({ status: 'copying' });
    expect(await spaceOf(8)).toBe(spaceBefore);
    expect(await monthRows(8)).toEqual(before);
    expect(await rebuild.rebuild('p202609')).toBe('rebuilt');
    expect(await monthRows(8)).toEqual(before);
    expect(await spaceOf(8)).not.toBe(spaceBefore);
  });

  it('a month dropped (by retention) while its rebuild was unfinished: the copy goes and the record is closed', async () => {
    await fill(A, 7, 1200);
    const crashing = createMonthRebuild({
      db: t.db,
      logger,
      now: () => NOW,
      batchRows: BATCH,
      afterStep: (s) => {
        if (s === 'copied') throw new Error('simulated crash after copied');
      },
    });
    await expect(crashing.rebuild('p202608')).rejects.toThrow('simulated crash');
    expect(await t.db.schema.hasTable(stagingTableName('p202608'))).toBe(true);
    await dropPartition(t.db, 'readings', 'p202608');
    const job = createStorageMaintenanceJob({ db: t.db, logger, holder: 'test-a', now: () => NOW, batchRows: BATCH });
    await job.rebuildClosedMonths();
    expect(await t.db.schema.hasTable(stagingTableName('p202608'))).toBe(false);
    expect(await recordOf(7)).toMatchObject({ status: 'done', lastError: 'the month was dropped before its rebuild finished' });
    expect(await monthRows(7)).toEqual([]);
  });

  it('the ops CLI shows the partitions and the rebuilds', async () => {
    const res = await runOps(['storage']);
    expect(res.code, res.stderr).toBe(0);
    expect(res.stdout).toContain('readings: ');
    expect(res.stdout).toMatch(/p202602\s+done\s+5500 copied, 300 put back/);
    const json = JSON.parse((await runOps(['storage', '--json'])).stdout) as { tables: Array<{ table: string; partitioned: boolean }> };
    expect(json.tables.map((x) => [x.table, x.partitioned])).toEqual([
      ['readings', true],
      ['reading_rollups', true],
    ]);
  });

  it('a lease held by another server: the run skips quietly and changes nothing', async () => {
    const other = createStorageMaintenanceJob({ db: t.db, logger, holder: 'server-two', now: () => NOW });
    let inner: Awaited<ReturnType<typeof other.runOnce>> | null = null;
    await createLeaseRunner({ db: t.db, holder: 'server-one', now: () => NOW }).run(STORAGE_LEASE, 60_000, async () => {
      inner = await other.runOnce();
    });
    expect(inner).toEqual({ rebuilt: [], monthsMade: [], stopped: 'lease held by server-one' });
  });
});

/**
 * A rebuild that runs out of room. As in tests/api/disk-full.api.test.ts, a private MariaDB keeps
 * every table in a capped system tablespace (`--innodb-file-per-table=0`, at most 56 MB), so
 * InnoDB answers "the table is full" (ER_RECORD_FILE_FULL) as it does when the disk fills. A month
 * of 450,000 readings fits once but not twice: the copy must stop with one clear log line, the
 * month's readings stay as they were, the half-made copy goes (its room back to ingestion), and
 * readings can still be stored.
 */
describe('storage maintenance on a full database', () => {
  let server: PrivateMariaDb;
  let full: Db;
  let lab: TestLab;
  const CHANNEL = 7;
  const FEB = Date.UTC(2026, 1, 1);
  const ROWS = 400_000;
  const countFeb = async () => Number(((await full.raw('SELECT COUNT(*) AS n FROM readings PARTITION (p202602)')) as [Array<{ n: number }>])[0][0].n);

  beforeAll(async () => {
    server = await startPrivateMariaDb('lagbook_rebuild_full', {
      serverArgs: ['--innodb-file-per-table=0', '--innodb-data-file-path=ibdata1:12M:autoextend:max:56M'],
    });
    full = createDb(server.dbConfig);
    // The schema up to this job's own table is all the test needs (later migrations are other work).
    const source = new LagbookMigrationSource(migrationsDirectory());
    for (const file of await source.getMigrations()) {
      const name = source.getMigrationName(file);
      if (name <= '20261204110210_create-storage-rebuilds') await full.migrate.up({ migrationSource: source, tableName: 'knex_migrations', name });
    }
    lab = await buildLab(full, { name: 'Crowded lab' });
    await ensureMonthsFrom(full, 'readings', Date.UTC(2026, 0, 1));
    // 400,000 readings a second apart in February (about three quarters of the capped tablespace: the copy cannot fit), in 50,000-row statements (small undo in the capped tablespace)
    for (let i = 0; i < ROWS; i += 50_000) {
      await full.raw(
        `SET STATEMENT max_recursive_iterations = 100000 FOR INSERT INTO readings (tenant_id, channel_id, ts, value)
         WITH RECURSIVE n(i) AS (SELECT ? UNION ALL SELECT i + 1 FROM n WHERE i < ?) SELECT ?, ?, ? + i * 1000, i / 7 FROM n`,
        [i, i + 49_999, lab.id, CHANNEL, FEB],
      );
      // let purge free the statement's undo pages first: on a busy machine purge lags, and undo in the
      // capped system tablespace would fill it before the readings do
      await server.asRoot('SET GLOBAL innodb_max_purge_lag_wait = 0');
    }
  }, 180_000);

  afterAll(async () => {
    await full?.destroy();
    await server?.destroy();
  }, 30_000);

  it('stops the rebuild with one clear log line, keeps every reading, drops the half-made copy, and ingestion goes on', async () => {
    expect(await countFeb()).toBe(ROWS);
    const sumBefore = await full.raw('SELECT SUM(ts) AS s, SUM(value) AS v FROM readings PARTITION (p202602)');
    lines.length = 0;
    const job = createStorageMaintenanceJob({ db: full, logger, holder: 'full-test', now: () => MID_MARCH });
    const summary = await job.runOnce();
    expect(summary.stopped).toBe('no room left');
    expect(summary.rebuilt).not.toContain('p202602');
    const errors = lines.filter((l) => l.level === 'error');
    expect(errors).toHaveLength(1);
    expect(errors[0].msg).toContain('rebuild of readings p202602 stopped — the database has no room left');
    expect(errors[0].msg).toContain('readings are intact and ingestion goes on');
    expect(await countFeb()).toBe(ROWS);
    expect(await full.raw('SELECT SUM(ts) AS s, SUM(value) AS v FROM readings PARTITION (p202602)')).toEqual(sumBefore);
    expect(await full.schema.hasTable(stagingTableName('p202602'))).toBe(false);
    expect(await storageRebuildsRepo(full).get(FEB)).toMatchObject({ status: 'copying', lastError: 'the database has no room left' });

    // ingestion stores again (InnoDB hands the dropped copy's pages back in the background: retry as a logger would)
    const rows = Array.from({ length: 500 }, (_, i) => ({
      tenant_id: lab.id,
      channel_id: CHANNEL,
      ts: Date.UTC(2026, 2, 1) + i * 1000,
      value: i,
    }));
    let stored = false;
    for (let attempt = 0; attempt < 60 && !stored; attempt++) {
      try {
        await full('readings').insert(rows);
        stored = true;
      } catch {
        await new Promise((r) => setTimeout(r, 500));
      }
    }
    expect(stored).toBe(true);
  }, 120_000);
});
