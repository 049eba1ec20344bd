import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { ensureMonthsFrom, listPartitions, BEFORE_PARTITION, type PartitionedTable } from '../../server/db/reading-partitions.ts';
import { retentionRecordsRepo } from '../../server/db/retention.repo.ts';
import { loadPlanCatalog, parsePlanCatalog } from '../../server/services/billing/plan-catalog.ts';
import { createRetentionJob, labHorizons, RETENTION_LEASE } from '../../server/services/retention/retention-job.ts';
import { dropJournaledPartition, journalPartitionDrop } from '../../server/services/retention/partition-drops.ts';
import { pruneLab } from '../../server/services/retention/prune-lab.ts';
import { createRetentionView } from '../../server/services/retention/retention-view.ts';
import { presentRetention } from '../../server/http/billing/retention.routes.ts';
import { createLeaseRunner } from '../../server/jobs/job-lease.ts';
import { createLogWriter } from '../../server/log-writer.ts';

/**
 * Retention against the real MariaDB (issue #20 item 3). Readings of 2024 go straight into the
 * tables (with their hour and day rollups and counters, as ingestion leaves them), in months of
 * their own; the job runs with a simulated clock in 2024–2025, so readings other test files
 * wrote (2026) lie after every horizon here. Plans (a copy of the shipped catalog):
 *   free "seedling": keeps everything; "transect": 200 days of history + 10 export days;
 *   "watershed": 250 days + 0.
 * At NOW = 2024-12-15T12:00Z the horizons are 2024-05-19 (transect: 210 days back, calendar
 * arithmetic, common practice) and 2024-04-09 (watershed: 250 days back).
 * Every check compares with the rows as they were: counts per channel, and the rollups recomputed
 * from the readings left.
 */
const DAY = 86_400_000;
const NOW = new Date(Date.UTC(2024, 11, 15, 12));
const HORIZON_TRANSECT = Date.UTC(2024, 4, 19);
const HORIZON_WATERSHED = Date.UTC(2024, 3, 9);
const month = (y: number, m: number) => Date.UTC(y, m, 1);
const logger = createLogWriter({ silent: true });

let t: TestApp;
let plansFile: string;
/** The first month partition of each table before this file split the catch-all (restored after). */
const originalFirstMonth = new Map<PartitionedTable, number>();

function writeCatalog(): string {
  const shipped = JSON.parse(readFileSync('tenants/plans.json', 'utf8')) as {
    plans: Array<{ key: string; limits: { historyDays: number }; readingRemoval: unknown }>;
  };
  for (const p of shipped.plans) {
    if (p.key === 'transect') {
      p.limits.historyDays = 200;
      p.readingRemoval = { enabled: true, exportDays: 10 };
    }
    if (p.key === 'watershed') {
      p.limits.historyDays = 250;
      p.readingRemoval = { enabled: true, exportDays: 0 };
    }
  }
  const path = join(mkdtempSync(join(tmpdir(), 'lagbook-retention-plans-')), 'plans.json');
  writeFileSync(path, JSON.stringify(shipped));
  return path;
}

/** Puts a lab on a plan (an active subscription row, as a confirmed checkout leaves it). */
async function onPlan(lab: LabWithEverything, planKey: string): Promise<void> {
  await t
    .db('lab_billing')
    .insert({ tenant_id: lab.lab.id, plan_key: planKey, status: 'active', quarantined_count: 1 })
    .onConflict('tenant_id')
    .merge(['plan_key', 'status']);
}

/** A second channel on the lab's logger. */
async function secondChannel(lab: LabWithEverything): Promise<number> {
  const id = lab.ids.channelId + 7;
  await t.db('channels').insert({ tenant_id: lab.lab.id, id, logger_id: lab.ids.loggerId, channel_key: 'soil_t', label: 'Soil temperature', unit: '°C' });
  return id;
}

/** Readings every `stepH` hours over [from, to) for one channel, then its rollups and counters recomputed as ingestion keeps them. */
async function fill(lab: LabWithEverything, channelId: number, from: number, to: number, stepH = 6): Promise<void> {
  const rows = [];
  for (let ts = from, i = 0; ts < to; ts += stepH * 3_600_000, i++)
    rows.push({ tenant_id: lab.lab.id, channel_id: channelId, ts, value: Math.round(Math.sin(i / 9) * 500) / 100 });
  for (let i = 0; i < rows.length; i += 2000) await t.db('readings').insert(rows.slice(i, i + 2000));
  await recount(lab);
}

/** Rollups (hour and day) recomputed from the readings of the lab, the channel counters and the lab's counter set to COUNT(*). */
async function recount(lab: LabWithEverything): Promise<void> {
  const id = lab.lab.id;
  await t.db('reading_rollups').where({ tenant_id: id }).delete();
  for (const res of [3600, 86400]) {
    await t.db.raw(
      `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
       SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*) FROM readings WHERE tenant_id = ? GROUP BY tenant_id, channel_id, b`,
      [res, res * 1000, id],
    );
  }
  await t.db.raw(
    'UPDATE channels c SET stored_readings = (SELECT COUNT(*) FROM readings r WHERE r.tenant_id = c.tenant_id AND r.channel_id = c.id) WHERE c.tenant_id = ?',
    [id],
  );
  await t.db.raw('UPDATE lab_billing SET readings_count = (SELECT COUNT(*) FROM readings WHERE tenant_id = ?) WHERE tenant_id = ?', [id, id]);
}

type Reading = [number, number];
async function readingsOf(lab: LabWithEverything): Promise<Reading[]> {
  const rows = (await t.db('readings').where({ tenant_id: lab.lab.id }).orderBy(['channel_id', 'ts']).select('channel_id', 'ts')) as Array<{
    channel_id: number;
    ts: number;
  }>;
  return rows.map((r) => [Number(r.channel_id), Number(r.ts)]);
}

/** Counters against COUNT(*): each channel's stored_readings and the lab's billing count. */
async function expectCountersExact(lab: LabWithEverything): Promise<void> {
  const channels = (await t.db('channels').where({ tenant_id: lab.lab.id }).select('id', 'stored_readings')) as Array<{ id: number; stored_readings: number }>;
  for (const c of channels) {
    const n = Number((await t.db('readings').where({ tenant_id: lab.lab.id, channel_id: c.id }).count({ n: '*' }).first())?.n);
    expect(Number(c.stored_readings), `channel ${c.id}`).toBe(n);
  }
  const total = Number((await t.db('readings').where({ tenant_id: lab.lab.id }).count({ n: '*' }).first())?.n);
  const billing = await t.db('lab_billing').where({ tenant_id: lab.lab.id }).first('readings_count');
  if (billing) expect(Number(billing.readings_count)).toBe(total);
}

/** Every rollup row of the lab equals the one recomputed from the readings left, and none is missing or extra. */
async function expectRollupsMatchReadings(lab: LabWithEverything): Promise<void> {
  const stored = await t.db.raw(
    'SELECT channel_id, resolution_s, bucket_start, count_value, min_value, max_value FROM reading_rollups WHERE tenant_id = ? ORDER BY channel_id, resolution_s, bucket_start',
    [lab.lab.id],
  );
  const recomputed = await t.db.raw(
    `SELECT channel_id, res AS resolution_s, ts - MOD(ts, res * 1000) AS bucket_start, COUNT(*) AS count_value, MIN(value) AS min_value, MAX(value) AS max_value
       FROM readings JOIN (SELECT 3600 AS res UNION ALL SELECT 86400) r WHERE tenant_id = ?
      GROUP BY channel_id, res, bucket_start ORDER BY channel_id, resolution_s, bucket_start`,
    [lab.lab.id],
  );
  const norm = (rows: Array<Record<string, unknown>>) => rows.map((r) => Object.values(r).map(Number));
  expect(norm(stored[0])).toEqual(norm(recomputed[0]));
}

const partitionNames = async (table: PartitionedTable) => (await listPartitions(t.db, table)).map((p) => p.name);
const job = (holder = 'retention-test', now = NOW, batchRows = 50) =>
  createRetentionJob({ db: t.db, catalog: loadPlanCatalog(plansFile), logger, holder, now: () => now, batchRows });

beforeAll(async () => {
  plansFile = writeCatalog();
  t = await buildTestApp();
  for (const table of ['readings', 'reading_rollups'] as const) {
    const first = (await listPartitions(t.db, table)).find((p) => p.kind !== 'before');
    originalFirstMonth.set(table, first!.monthStart);
    // 2023 and 2024 get months of their own (the fresh database was partitioned from the month it was made in)
    await ensureMonthsFrom(t.db, table, month(2023, 0));
  }
}, 60_000);

afterAll(async () => {
  // Give the catch-all its original range back, so later files find the partitions as migrated.
  if (t) {
    for (const [table, firstMonth] of originalFirstMonth) {
      const below = (await listPartitions(t.db, table)).filter((p) => p.kind !== 'future' && p.monthEnd <= firstMonth).map((p) => p.name);
      if (below.length > 1)
        await t.db.raw(`ALTER TABLE ?? REORGANIZE PARTITION ${below.join(', ')} INTO (PARTITION ${BEFORE_PARTITION} VALUES LESS THAN (${firstMonth}))`, [
          table,
        ]);
    }
  }
  await t?.close();
}, 60_000);

describe('retention job', () => {
  let A: LabWithEverything;
  let B: LabWithEverything;
  let K: LabWithEverything;
  let aSoil: number;
  const before = new Map<number, Reading[]>();

  beforeAll(async () => {
    A = await buildLabWithEverything(t.db, { name: 'Transect lab' });
    B = await buildLabWithEverything(t.db, { name: 'Watershed lab' });
    K = await buildLabWithEverything(t.db, { name: 'Seedling lab' });
    await onPlan(A, 'transect');
    await onPlan(B, 'watershed');
    aSoil = await secondChannel(A);
    await fill(A, A.ids.channelId, month(2024, 0), month(2024, 7));
    await fill(A, aSoil, month(2024, 0) + 3 * DAY, month(2024, 6), 3);
    await fill(B, B.ids.channelId, month(2024, 0), month(2024, 7));
    // the keep-everything lab holds rows in February and June only
    await fill(K, K.ids.channelId, month(2024, 1) + DAY, month(2024, 1) + 20 * DAY);
    await fill(K, K.ids.channelId, month(2024, 5), month(2024, 5) + 3 * DAY);
    for (const lab of [A, B, K]) before.set(lab.lab.id, await readingsOf(lab));
  }, 60_000);

  it('computes the horizons the plans give', async () => {
    const horizons = await labHorizons(t.db, loadPlanCatalog(plansFile), NOW);
    expect(horizons.get(A.lab.id)).toBe(HORIZON_TRANSECT);
    expect(horizons.get(B.lab.id)).toBe(HORIZON_WATERSHED);
    expect(horizons.get(K.lab.id)).toBe(Number.NEGATIVE_INFINITY);
  });

  it('drops the months every lab of which is past them, keeps a month a keep-everything lab holds, prunes partial months per lab', async () => {
    for (const table of ['readings', 'reading_rollups'] as const) {
      expect(await partitionNames(table)).toEqual(expect.arrayContaining(['p202401', 'p202402', 'p202403', 'p202404', 'p202405']));
    }
    // only this file's labs hold rows in 2024 (a precondition: another lab's rows would hold a month);
    // earlier rows (ingest.api's property test may store a reading at a 1970 time) lie in p_before, which no month covers
    const labsIn2024 = await t.db('readings').where('ts', '>=', month(2024, 0)).where('ts', '<', month(2025, 0)).distinct('tenant_id');
    expect(labsIn2024.map((r: { tenant_id: number }) => Number(r.tenant_id)).sort()).toEqual([A.lab.id, B.lab.id, K.lab.id].sort());

    const run = await job().runOnce();
    expect(run.ran).toBe(true);
    if (!run.ran) return;
    // January and March: every lab there (A, B) is past their end. February: K keeps it. April: B's horizon (Apr 9) is inside it.
    expect(run.summary.partitionsDropped).toEqual(['p202401', 'p202403']);
    expect(run.summary.errors).toEqual([]);
    for (const table of ['readings', 'reading_rollups'] as const) {
      const names = await partitionNames(table);
      expect(names).not.toContain('p202401');
      expect(names).not.toContain('p202403');
      expect(names).toEqual(expect.arrayContaining(['p202402', 'p202404', 'p202405', 'p202406']));
    }

    // each lab: nothing at or after its horizon is missing, nothing before it is left
    for (const [lab, horizon] of [
      [A, HORIZON_TRANSECT],
      [B, HORIZON_WATERSHED],
      [K, Number.NEGATIVE_INFINITY],
    ] as const) {
      const now = await readingsOf(lab);
      expect(now).toEqual(before.get(lab.lab.id)!.filter(([, ts]) => ts >= horizon));
      await expectCountersExact(lab);
      await expectRollupsMatchReadings(lab);
    }
    expect((await readingsOf(A)).some(([c]) => c === aSoil)).toBe(true);
    const removed = before.get(A.lab.id)!.length + before.get(B.lab.id)!.length - (await readingsOf(A)).length - (await readingsOf(B)).length;
    expect(run.summary.readingsRemoved).toBe(removed);

    const latest = await retentionRecordsRepo(t.db).latestRun();
    expect(latest).toMatchObject({ id: run.summary.runId, readingsRemoved: removed, partitionsDropped: 2, lastError: null });
    expect(latest!.finishedAt).not.toBeNull();

    // a second run the same day finds nothing more to remove
    const again = await job().runOnce();
    expect(again.ran && again.summary).toMatchObject({ partitionsDropped: [], readingsRemoved: 0 });
  });

  it('tells the admin of a removing lab the horizon, the oldest reading, what lies before the horizon and when the next removal runs; a keep-everything lab that nothing is removed', async () => {
    // a day later the transect horizon has moved to 2024-05-20: A's readings of May 19 lie before it
    const dayLater = new Date(NOW.getTime() + DAY);
    const view = createRetentionView({ db: t.db, catalog: loadPlanCatalog(plansFile), now: () => dayLater });
    const a = presentRetention(await view.forLab({ id: A.lab.id }));
    const dueA = (await readingsOf(A)).filter(([, ts]) => ts < HORIZON_TRANSECT + DAY).length;
    expect(dueA).toBeGreaterThan(0);
    expect(a).toEqual({
      removes: true,
      planName: 'Transect',
      historyDays: 200,
      exportDays: 10,
      horizon: '2024-05-20T00:00:00.000Z',
      oldestReading: '2024-05-19T00:00:00.000Z',
      readingsBeforeHorizon: dueA,
      // the latest run started at NOW: the next one a day later
      nextRemovalAt: '2024-12-16T12:00:00.000Z',
      sentence: expect.stringContaining(`${dueA} readings are due for removal`),
    });
    const k = presentRetention(await view.forLab({ id: K.lab.id }));
    expect(k).toEqual({ removes: false, planName: 'Seedling', historyDays: 90, sentence: expect.stringContaining('never removes readings') });
  });
});

describe('retention after a crash', () => {
  it('resumes a drop journaled but not done (decided afresh) and settles a drop done but not counted', async () => {
    // Later in time: transect's horizon at 2025-06-01 is 2024-11-03, past August and September.
    const later = new Date(Date.UTC(2025, 5, 1));
    const C = await buildLabWithEverything(t.db, { name: 'Crash lab' });
    await onPlan(C, 'transect');
    await fill(C, C.ids.channelId, month(2024, 7), month(2024, 10));
    const records = retentionRecordsRepo(t.db);
    const horizons = await labHorizons(t.db, loadPlanCatalog(plansFile), later);
    const runId = await records.startRun('crashed-holder', later);
    const partitions = await listPartitions(t.db, 'readings');
    const aug = partitions.find((p) => p.name === 'p202408')!;
    const sep = partitions.find((p) => p.name === 'p202409')!;
    const total = (await readingsOf(C)).length;
    const inSep = (await readingsOf(C)).filter(([, ts]) => ts >= month(2024, 8) && ts < month(2024, 9)).length;

    // August: journaled, then the process died before the drop — every reading still there, counters untouched
    expect(await journalPartitionDrop(t.db, runId, aug, horizons, later)).not.toBeNull();
    // September: journaled and dropped, then the process died before the counters were lowered
    const sepDrop = await journalPartitionDrop(t.db, runId, sep, horizons, later);
    await dropJournaledPartition(t.db, sepDrop!, horizons);
    expect(await partitionNames('readings')).not.toContain('p202409');
    expect((await readingsOf(C)).length).toBe(total - inSep);
    const counter = async () => Number((await t.db('channels').where({ tenant_id: C.lab.id, id: C.ids.channelId }).first('stored_readings')).stored_readings);
    expect(await counter()).toBe(total); // high by September's rows until the next run settles it
    expect((await records.openDrops()).map((d) => d.partitionName)).toEqual(['p202408', 'p202409']);

    const run = await job('retention-after-crash', later).runOnce();
    expect(run.ran).toBe(true);
    if (!run.ran) return;
    expect(run.summary.resumed).toEqual({ settled: 1, cancelled: 1 });
    expect(run.summary.partitionsDropped).toContain('p202408');
    expect(await records.openDrops()).toEqual([]);
    // transect's horizon 2024-11-03 lies after all of C's readings (Aug–Oct)
    expect(await readingsOf(C)).toEqual([]);
    await expectCountersExact(C);
    await expectRollupsMatchReadings(C);
    const journal = await t.db('retention_partition_drops').where({ run_id: runId }).orderBy('id');
    expect(
      journal.map((j: { partition_name: string; settled_at: Date | null; cancelled_at: Date | null }) => [j.partition_name, !!j.settled_at, !!j.cancelled_at]),
    ).toEqual([
      ['p202408', false, true],
      ['p202409', true, false],
    ]);
  });
});

describe('pruning stopped part way', () => {
  it('keeps every batch whole: stopped after three batches, counters match what is left; the next pass finishes', async () => {
    const D = await buildLabWithEverything(t.db, { name: 'Interrupted lab' });
    await onPlan(D, 'transect');
    const soil = await secondChannel(D);
    await fill(D, D.ids.channelId, Date.UTC(2024, 9, 15), Date.UTC(2024, 10, 20));
    await fill(D, soil, Date.UTC(2024, 9, 20), Date.UTC(2024, 10, 10), 2);
    const all = await readingsOf(D);
    const horizon = Date.UTC(2024, 10, 3);
    let batches = 0;
    const stopAfterThree = async () => {
      if (++batches > 3) throw new Error('the process stopped here');
    };
    await expect(pruneLab(t.db, D.lab.id, horizon, { batchRows: 20, beforeEachBatch: stopAfterThree })).rejects.toThrow('the process stopped here');
    const partWay = await readingsOf(D);
    expect(partWay.length).toBe(all.length - 60); // three whole batches of 20, nothing of a fourth
    expect(partWay.filter(([, ts]) => ts >= horizon)).toEqual(all.filter(([, ts]) => ts >= horizon));
    await expectCountersExact(D);

    expect(await pruneLab(t.db, D.lab.id, horizon, { batchRows: 20 })).toBe(all.filter(([, ts]) => ts < horizon).length - 60);
    expect(await readingsOf(D)).toEqual(all.filter(([, ts]) => ts >= horizon));
    await expectCountersExact(D);
    await expectRollupsMatchReadings(D);
  });
});

describe('one retention run across app servers', () => {
  it('a second runner skips while another holds the lease, and runs once it is released', async () => {
    const other = createLeaseRunner({ db: t.db, holder: 'another-app-server', now: () => NOW });
    const inside = await other.run(RETENTION_LEASE, 60_000, async () => job('this-app-server').runOnce());
    expect(inside).toEqual({ ran: true, value: { ran: false, heldBy: 'another-app-server' } });
    const after = await job('this-app-server').runOnce();
    expect(after.ran).toBe(true);
    expect((await retentionRecordsRepo(t.db).latestRun())?.holder).toBe('this-app-server');
  });
});

describe('retention on random plans and readings (seeded property test on the real database)', () => {
  const labPlan = fc.record({ historyDays: fc.integer({ min: 1, max: 300 }), exportDays: fc.integer({ min: 0, max: 30 }), enabled: fc.boolean() });
  const range = fc.record({ startDay: fc.integer({ min: 0, max: 360 }), days: fc.integer({ min: 1, max: 70 }), stepH: fc.integer({ min: 2, max: 23 }) });
  const round = fc.record({
    labs: fc.array(fc.record({ plan: labPlan, ranges: fc.array(range, { minLength: 1, maxLength: 3 }) }), { minLength: 1, maxLength: 4 }),
    /** Days after 2023-01-01 the run happens. */
    nowDay: fc.integer({ min: 60, max: 480 }),
  });
  let n = 0;
  let dropped = 0;
  let pruned = 0;

  it('leaves every reading at or after its lab’s horizon, none before a removing lab’s horizon, counters equal to COUNT(*) and rollups equal to a recount', async () => {
    await fc.assert(
      fc.asyncProperty(round, async ({ labs, nowDay }) => {
        const r = n++;
        const now = new Date(month(2023, 0) + nowDay * DAY + 13 * 3_600_000);
        // one plan per lab, made up for the round (the free plan keeps everything)
        const catalog = parsePlanCatalog({
          currency: 'eur',
          plans: [
            {
              key: 'seedling',
              name: 'Seedling',
              monthlyAmount: 0,
              priceLookupKey: null,
              limits: { readings: 1e9, loggers: 9, members: 9, historyDays: 90, quarantinedRows: 9 },
            },
            ...labs.map((l, i) => ({
              key: `round-${r}-${i}`,
              name: `Round ${r} plan ${i}`,
              monthlyAmount: 100,
              priceLookupKey: `round-${r}-${i}`,
              limits: { readings: 1e9, loggers: 9, members: 9, historyDays: l.plan.historyDays, quarantinedRows: 9 },
              readingRemoval: { enabled: l.plan.enabled, exportDays: l.plan.exportDays },
            })),
          ],
        });
        const made: Array<{ lab: LabWithEverything; before: Reading[]; horizon: number }> = [];
        for (const [i, l] of labs.entries()) {
          const lab = await buildLabWithEverything(t.db, { name: `Random lab ${r}-${i}` });
          await onPlan(lab, `round-${r}-${i}`);
          for (const g of l.ranges) {
            const from = month(2023, 0) + g.startDay * DAY + g.stepH * 60_000;
            // ranges may overlap: keep the channel's times unique
            const have = new Set((await readingsOf(lab)).map(([, ts]) => ts));
            const rows = [];
            for (let ts = from; ts < from + g.days * DAY; ts += g.stepH * 3_600_000)
              if (!have.has(ts)) rows.push({ tenant_id: lab.lab.id, channel_id: lab.ids.channelId, ts, value: (ts % 997) / 10 });
            for (let k = 0; k < rows.length; k += 2000) await t.db('readings').insert(rows.slice(k, k + 2000));
          }
          await recount(lab);
          // the horizon from the plan's own terms (not through removalHorizon)
          const horizon = l.plan.enabled ? Math.floor((now.getTime() - (l.plan.historyDays + l.plan.exportDays) * DAY) / DAY) * DAY : Number.NEGATIVE_INFINITY;
          made.push({ lab, before: await readingsOf(lab), horizon });
        }
        const run = await createRetentionJob({ db: t.db, catalog, logger, holder: 'random-rounds', now: () => now, batchRows: 37 }).runOnce();
        expect(run.ran && run.summary.errors).toEqual([]);
        if (run.ran) {
          dropped += run.summary.partitionsDropped.length;
          pruned += run.summary.readingsRemoved;
        }
        for (const m of made) {
          expect(await readingsOf(m.lab)).toEqual(m.before.filter(([, ts]) => ts >= m.horizon));
          await expectCountersExact(m.lab);
          await expectRollupsMatchReadings(m.lab);
        }
        // the round's labs leave nothing behind for the next round
        for (const m of made) {
          await t.db('readings').where({ tenant_id: m.lab.lab.id }).delete();
          await t.db('reading_rollups').where({ tenant_id: m.lab.lab.id }).delete();
        }
      }),
      { seed: 20261204, numRuns: 6 },
    );
    // the seeded rounds took both paths: whole partitions dropped, and readings removed
    expect(dropped).toBeGreaterThan(0);
    expect(pruned).toBeGreaterThan(0);
  }, 120_000);
});
