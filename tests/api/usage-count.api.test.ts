import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { usageRepo } from '../../server/db/usage.repo.ts';
import { createUsageJob, USAGE_JOB_INTERVAL_MS, USAGE_LEASE, USAGE_LEASE_TTL_MS } from '../../server/services/billing/usage-job.ts';
import { createLeaseRunner, LeaseLostError, type HeldLease } from '../../server/jobs/job-lease.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer } from '../../server/integrations/mail/create-mailer.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';
import * as backfill from '../../migrations/20261204110010_backfill-channel-stored-readings.ts';
import { createDb } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { LagbookMigrationSource, migrationsDirectory } from '../../server/db/migration-source.ts';
import { buildLab } from '../support/factories.ts';

/**
 * Usage counted without scanning (issue #20 item 4): each channel's `stored_readings` counter
 * stays equal to COUNT(*) of its rows in `readings` through every way readings come in, the
 * lab's count is a keyed read of one row per channel, and reconciliation runs on one server.
 */
let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

const T0 = Date.UTC(2026, 5, 1, 0, 0, 0);
const MIN = 60_000;

/** A lab with two channels on one logger ('air_t' from the fixture, 'rh' added), and an admin's cookie. */
async function twoChannelLab(): Promise<{ f: LabWithEverything; rhId: number; cookie: string }> {
  const f = await buildLabWithEverything(t.db);
  const rhId = f.ids.channelId + 1;
  await t.db('channels').insert({ tenant_id: f.lab.id, id: rhId, logger_id: f.ids.loggerId, channel_key: 'rh', label: 'Humidity', unit: '%' });
  return { f, rhId, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id) };
}

type Row = { channel: string; ts: number; value: number | string };

const post = (f: LabWithEverything, readings: Row[]) => request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings });

/** Every channel's counter next to COUNT(*) of its readings, and the lab's count both ways. */
async function counters(f: LabWithEverything) {
  const channels: Array<{ id: number; stored: number }> = await t
    .db('channels')
    .where('tenant_id', f.lab.id)
    .orderBy('id')
    .select('id', 'stored_readings as stored');
  const counted: Array<{ id: number; n: number }> = await t
    .db('readings')
    .where('tenant_id', f.lab.id)
    .groupBy('channel_id')
    .select('channel_id as id')
    .count({ n: '*' });
  const byChannel = new Map(counted.map((c) => [Number(c.id), Number(c.n)]));
  return {
    counters: channels.map((c) => [Number(c.id), Number(c.stored)]),
    counts: channels.map((c) => [Number(c.id), byChannel.get(Number(c.id)) ?? 0]),
    labCount: await usageRepo(inLab(t.db, f.lab.id)).storedReadings(),
    labRows: counted.reduce((a, c) => a + Number(c.n), 0),
  };
}

async function expectExact(f: LabWithEverything, rows: number) {
  const c = await counters(f);
  expect(c.counters).toEqual(c.counts);
  expect(c.labRows).toBe(rows);
  expect(c.labCount).toBe(rows);
}

describe('channels.stored_readings equals COUNT(*) of readings', () => {
  it('after new, duplicate, conflicting and mixed batches (several channels, some rows quarantined)', async () => {
    const { f } = await twoChannelLab();
    const first: Row[] = [];
    for (let i = 0; i < 40; i++) first.push({ channel: 'air_t', ts: T0 + i * MIN, value: i }, { channel: 'rh', ts: T0 + i * MIN, value: 50 + i });
    expect((await post(f, first).expect(200)).body).toMatchObject({ accepted: 80, duplicates: 0 });
    await expectExact(f, 80);

    // the same batch again: all duplicates
    expect((await post(f, first).expect(200)).body).toMatchObject({ accepted: 0, duplicates: 80 });
    await expectExact(f, 80);

    // other values at stored times: conflicts, the stored values stay
    const conflicting = first.slice(0, 10).map((r) => ({ ...r, value: Number(r.value) + 0.5 }));
    const res = await post(f, conflicting).expect(200);
    expect(res.body.accepted).toBe(0);
    expect(res.body.quarantined).toHaveLength(10);
    await expectExact(f, 80);

    // mixed: air_t has duplicates + 7 new, rh has conflicts + 3 new, plus two unreadable rows
    const mixed: Row[] = [
      ...first.filter((r) => r.channel === 'air_t').slice(30),
      ...Array.from({ length: 7 }, (_, i) => ({ channel: 'air_t', ts: T0 + (40 + i) * MIN, value: i })),
      ...first
        .filter((r) => r.channel === 'rh')
        .slice(35)
        .map((r) => ({ ...r, value: -1 })),
      ...Array.from({ length: 3 }, (_, i) => ({ channel: 'rh', ts: T0 + (100 + i) * MIN, value: i })),
      { channel: 'air_t', ts: T0, value: 'warm' },
      { channel: 'no_such_channel', ts: T0, value: 1 },
    ];
    const mixedRes = await post(f, mixed).expect(200);
    expect(mixedRes.body).toMatchObject({ accepted: 10, duplicates: 10 });
    expect(mixedRes.body.quarantined).toHaveLength(7);
    await expectExact(f, 90);

    // one channel all duplicates, the other all new
    const half: Row[] = [
      ...first.filter((r) => r.channel === 'air_t'),
      ...Array.from({ length: 5 }, (_, i) => ({ channel: 'rh', ts: T0 - (i + 1) * MIN, value: i })),
    ];
    expect((await post(f, half).expect(200)).body).toMatchObject({ accepted: 5, duplicates: 40 });
    await expectExact(f, 95);
  });

  it('after random sequences of overlapping batches across two channels', async () => {
    const { f } = await twoChannelLab();
    // times on a small grid, so batches keep meeting rows already stored (same or other values)
    const row = fc.record({ channel: fc.constantFrom('air_t', 'rh'), slot: fc.integer({ min: 0, max: 40 }), value: fc.integer({ min: 0, max: 2 }) });
    const seen = new Set<string>();
    await fc.assert(
      fc.asyncProperty(fc.array(row, { minLength: 1, maxLength: 30 }), async (batch) => {
        const readings = batch.map((r) => ({ channel: r.channel, ts: T0 + r.slot * MIN, value: r.value }));
        const res = await post(f, readings).expect(200);
        for (const r of readings) seen.add(`${r.channel}@${r.ts}`);
        expect(res.body.accepted + res.body.duplicates + res.body.quarantined.length).toBe(readings.length);
        await expectExact(f, seen.size);
      }),
      { numRuns: 25, seed: 20261204 },
    );
  });

  it('after uploads (new and sent again) and quarantine re-submits', async () => {
    const { f, cookie } = await twoChannelLab();
    const lines = ['time,t,h'];
    for (let i = 0; i < 300; i++) lines.push(`${new Date(T0 + i * MIN).toISOString()},${i / 10},${i === 5 ? 'oops' : 40 + (i % 7)}`);
    const options = { format: 'wide', timeColumn: 'time', columns: { t: 'air_t', h: 'rh' }, timeFormat: 'iso' };
    const upload = () =>
      request(t.app)
        .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${encodeURIComponent(JSON.stringify(options))}`)
        .set('Cookie', cookie)
        .set('Content-Type', 'text/csv')
        .send(lines.join('\n'));
    const summary = (await upload().expect(200)).text
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l))
      .at(-1);
    expect(summary).toMatchObject({ accepted: 599, quarantined: 1 });
    await expectExact(f, 599);
    const again = (await upload().expect(200)).text
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l))
      .at(-1);
    expect(again).toMatchObject({ accepted: 0, duplicates: 599 });
    await expectExact(f, 599);

    // fix the unreadable humidity value and re-submit it (and the fixture's own quarantined row)
    const bad = await t.db('quarantined_rows').where({ tenant_id: f.lab.id, source: 'upload' }).first(); // the only upload row quarantined
    const resubmit = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/quarantine/resubmit`)
      .set('Cookie', cookie)
      .send({
        rows: [
          { id: Number(bad.id), channel: 'rh', ts: new Date(T0 + 5 * MIN).toISOString(), value: 41 },
          { id: f.ids.quarantinedId, channel: 'air_t', ts: '2026-01-01T00:00:00Z', value: 3.5 },
        ],
      })
      .expect(200);
    expect(resubmit.body.resubmitted).toBe(2);
    await expectExact(f, 601);
  });
});

/** Every table access in a MariaDB `ANALYZE FORMAT=JSON` plan, wherever it is nested. */
function tablesIn(plan: unknown): Array<{ table_name: string; key?: string; access_type: string; rows: number; r_rows: number }> {
  const found: Array<{ table_name: string; key?: string; access_type: string; rows: number; r_rows: number }> = [];
  const walk = (node: unknown) => {
    if (Array.isArray(node)) node.forEach(walk);
    else if (node && typeof node === 'object') {
      for (const [k, v] of Object.entries(node)) {
        if (k === 'table' && v && typeof v === 'object' && 'table_name' in v) found.push(v as (typeof found)[number]);
        walk(v);
      }
    }
  };
  walk(plan);
  return found;
}

describe('the backfill and the counting statement', () => {
  it('the backfill migration recounts every channel from readings, and running it again changes nothing', async () => {
    const { f } = await twoChannelLab();
    await post(f, [...Array.from({ length: 9 }, (_, i) => ({ channel: 'rh', ts: T0 + i * MIN, value: i })), { channel: 'air_t', ts: T0, value: 2 }]).expect(
      200,
    );
    // as on a database migrated from before the counter: every channel at the column's default
    await t.db('channels').where('tenant_id', f.lab.id).update({ stored_readings: 0 });
    expect((await counters(f)).labCount).toBe(0);
    await backfill.up(t.db);
    await expectExact(f, 10);
    await backfill.up(t.db);
    await expectExact(f, 10);
  });

  it("the statement that advances a batch's channels reads each channel and its latest reading by primary key", async () => {
    const { f } = await twoChannelLab();
    // many more channels in the lab than in the batch: only the batch's two may be read
    await t.db('channels').insert(
      Array.from({ length: 60 }, (_, i) => ({
        tenant_id: f.lab.id,
        id: f.ids.channelId + 2 + i,
        logger_id: f.ids.loggerId,
        channel_key: `x${i}`,
        label: `X ${i}`,
      })),
    );
    await t.db.raw('ANALYZE TABLE channels');
    const sent: Array<{ sql: string; bindings: unknown[] }> = [];
    const listen = (q: { sql: string; bindings: unknown[] }) => sent.push(q);
    t.db.on('query', listen);
    try {
      await post(f, [
        { channel: 'air_t', ts: T0, value: 1 },
        { channel: 'rh', ts: T0, value: 2 },
      ]).expect(200);
    } finally {
      t.db.removeListener('query', listen);
    }
    const advance = sent.filter((q) => /^UPDATE channels c\s/.test(q.sql.trim()));
    expect(advance).toHaveLength(1);
    const [[row]] = (await t.db.raw(`EXPLAIN FORMAT=JSON ${advance[0].sql}`, advance[0].bindings as never)) as unknown as [[{ EXPLAIN: string }]];
    const tables = tablesIn(JSON.parse(row.EXPLAIN));
    const byName = Object.fromEntries(tables.filter((x) => !x.table_name.startsWith('<')).map((x) => [x.table_name, x]));
    expect(Object.keys(byName).sort()).toEqual(['c', 'r']);
    expect(byName.c.key).toBe('PRIMARY');
    expect(['eq_ref', 'range']).toContain(byName.c.access_type);
    expect(byName.c.rows).toBeLessThanOrEqual(2);
    expect(byName.r).toMatchObject({ access_type: 'eq_ref', key: 'PRIMARY' });
  });
});

describe('migrating a database filled before the counter', () => {
  /** The migrations of the schema as it was before this issue (all before 2026-12-04). */
  class SchemaBeforeCounter extends LagbookMigrationSource {
    override async getMigrations(): Promise<string[]> {
      return (await super.getMigrations()).filter((f) => f < '20261204');
    }
  }

  it('every channel ends with the count of its readings, and the lab count with their sum', async () => {
    const config = t.config.db;
    const scratch = `${config.database}_counter_backfill`;
    await t.db.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
    await t.db.raw(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    const old = createDb({ ...config, database: scratch });
    try {
      await old.migrate.latest({ migrationSource: new SchemaBeforeCounter(migrationsDirectory()), tableName: 'knex_migrations' });
      expect(await old.schema.hasColumn('channels', 'stored_readings')).toBe(false);
      // two labs, three channels (one without readings), readings written as today's ingestion writes them
      const expected = new Map<number, number>();
      const labs = [await buildLab(old), await buildLab(old)];
      for (const [l, lab] of labs.entries()) {
        const loggerId = 1000 + l;
        await old('loggers').insert({ tenant_id: lab.id, id: loggerId, name: `Mast ${l}`, timezone: 'UTC', expected_interval_s: 60 });
        for (let c = 0; c < (l === 0 ? 2 : 1); c++) {
          const channelId = 2000 + l * 10 + c;
          await old('channels').insert({ tenant_id: lab.id, id: channelId, logger_id: loggerId, channel_key: `c${c}`, label: `C ${c}` });
          const n = [1500, 0, 777][l * 2 + c];
          expected.set(channelId, n);
          const rows = Array.from({ length: n }, (_, i) => ({ tenant_id: lab.id, channel_id: channelId, ts: T0 + i * MIN, value: i / 10 }));
          for (let i = 0; i < rows.length; i += 500) await old('readings').insert(rows.slice(i, i + 500));
        }
      }
      await migrateToLatest(old);
      const after: Array<{ id: number; stored: number }> = await old('channels').orderBy('id').select('id', 'stored_readings as stored');
      expect(after.map((c) => [Number(c.id), Number(c.stored)])).toEqual([...expected.entries()].sort((a, b) => a[0] - b[0]));
      expect(await usageRepo(inLab(old, labs[0].id)).storedReadings()).toBe(1500);
      expect(await usageRepo(inLab(old, labs[1].id)).storedReadings()).toBe(777);
      expect(await old.schema.hasTable('job_leases')).toBe(true);
    } finally {
      await old.destroy();
      await t.db.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
    }
  });
});

describe('the lab count is a keyed read of its channel rows', () => {
  it('ANALYZE of the query storedReadings() sends reads at most one row per channel of the lab', async () => {
    const { f } = await twoChannelLab();
    // other labs with many channels: a scan of channels (or of readings) would read their rows too
    for (let n = 0; n < 3; n++) {
      const other = await buildLabWithEverything(t.db);
      await t.db('channels').insert(
        Array.from({ length: 40 }, (_, i) => ({
          tenant_id: other.lab.id,
          id: other.ids.channelId + 1 + i,
          logger_id: other.ids.loggerId,
          channel_key: `c${i}`,
          label: `C ${i}`,
        })),
      );
    }
    await post(f, [{ channel: 'air_t', ts: T0, value: 1 }, ...Array.from({ length: 500 }, (_, i) => ({ channel: 'rh', ts: T0 + i * MIN, value: i }))]).expect(
      200,
    );
    await t.db.raw('ANALYZE TABLE channels');

    const sent: Array<{ sql: string; bindings: unknown[] }> = [];
    const listen = (q: { sql: string; bindings: unknown[] }) => sent.push(q);
    t.db.on('query', listen);
    try {
      expect(await usageRepo(inLab(t.db, f.lab.id)).storedReadings()).toBe(501);
    } finally {
      t.db.removeListener('query', listen);
    }
    expect(sent).toHaveLength(1);
    expect(sent[0].sql).not.toMatch(/readings`? *(where|$)|reading_rollups/i);
    const [[row]] = (await t.db.raw(`ANALYZE FORMAT=JSON ${sent[0].sql}`, sent[0].bindings as never)) as unknown as [[{ ANALYZE: string }]];
    const tables = tablesIn(JSON.parse(row.ANALYZE));
    const channelsOfLab = Number((await t.db('channels').where('tenant_id', f.lab.id).count({ n: '*' }))[0].n);
    expect(channelsOfLab).toBe(2);
    expect(tables.map((x) => x.table_name)).toEqual(['channels']); // neither readings nor rollups
    expect(tables[0]).toMatchObject({ key: 'PRIMARY', access_type: 'ref' });
    expect(tables[0].r_rows).toBeLessThanOrEqual(channelsOfLab);
    expect(tables[0].rows).toBeLessThanOrEqual(channelsOfLab);
  });
});

describe('usage reconciliation runs on one server at a time', () => {
  const jobFor = (holder: string, now?: () => Date, cycleMs?: number) =>
    createUsageJob({
      db: t.db,
      catalog: loadPlanCatalog(t.config.stripe.plansFile),
      mailer: createMailer(t.config.smtp),
      logger: createLogWriter({ silent: true }),
      publicUrl: t.config.publicUrl,
      holder,
      now,
      cycleMs,
    });
  const billingCount = async (f: LabWithEverything) => Number((await t.db('lab_billing').where('tenant_id', f.lab.id).first())?.readings_count ?? -1);

  it('while one server holds the lease another skips its run and writes nothing; the holder reconciles; after release the other runs', async () => {
    const { f } = await twoChannelLab();
    await post(
      f,
      Array.from({ length: 12 }, (_, i) => ({ channel: 'air_t', ts: T0 + i * MIN, value: i })),
    ).expect(200);
    await t.db('lab_billing').where('tenant_id', f.lab.id).update({ readings_count: 3 }); // a lost bump, for reconciliation to repair
    const a = jobFor('server-a');
    const b = jobFor('server-b');
    const heldByA = createLeaseRunner({ db: t.db, holder: 'server-a' });
    const outcome = await heldByA.run(USAGE_LEASE, USAGE_LEASE_TTL_MS, async () => {
      const skipped = await b.runOnce();
      const countAfterSkip = await billingCount(f);
      const ranOnA = await a.runOnce(); // the holder itself may run
      return { skipped, countAfterSkip, ranOnA };
    });
    expect(outcome.ran).toBe(true);
    if (!outcome.ran) return;
    expect(outcome.value.skipped).toEqual({ ran: false, heldBy: 'server-a' });
    expect(outcome.value.countAfterSkip).toBe(3);
    expect(outcome.value.ranOnA).toMatchObject({ ran: true, failed: 0 });
    expect(await billingCount(f)).toBe(12);

    await t.db('lab_billing').where('tenant_id', f.lab.id).update({ readings_count: 4 });
    expect(await b.runOnce()).toMatchObject({ ran: true, failed: 0 });
    expect(await billingCount(f)).toBe(12);
  });

  it('two servers starting a run at the same moment: each run either reconciles or names the other as holder', async () => {
    const { f } = await twoChannelLab();
    await post(f, [{ channel: 'rh', ts: T0, value: 1 }]).expect(200);
    const runs = await Promise.all([jobFor('server-a').runOnce(), jobFor('server-b').runOnce()]);
    expect(runs.some((r) => r.ran)).toBe(true);
    runs.forEach((r, i) => {
      if (!r.ran) expect(r).toEqual({ ran: false, heldBy: i === 0 ? 'server-b' : 'server-a' });
    });
    expect(await billingCount(f)).toBe(1);
  });

  it('a server whose lease was taken over stops before writing (fencing checked before each write)', async () => {
    const { f } = await twoChannelLab();
    await post(
      f,
      Array.from({ length: 6 }, (_, i) => ({ channel: 'air_t', ts: T0 + i * MIN, value: i })),
    ).expect(200);
    await t.db('lab_billing').where('tenant_id', f.lab.id).update({ readings_count: 2 });
    let clock = Date.UTC(2026, 11, 4, 12);
    const now = () => new Date(clock);
    const name = `usage-test-${f.lab.id}`;
    const stale = createLeaseRunner({ db: t.db, holder: 'server-a', now });
    const fresh = createLeaseRunner({ db: t.db, holder: 'server-b', now });
    const job = jobFor('server-a', now);
    const labRow = { id: f.lab.id, slug: f.lab.slug, name: f.lab.name };
    const outcome = await stale.run(name, 1000, async (lease: HeldLease) => {
      clock += 1001; // server-a stalls past its lease; server-b takes it over
      const takeover = await fresh.run(name, 60_000, async () => {
        await expect(job.reconcileLab(labRow, lease)).rejects.toBeInstanceOf(LeaseLostError);
        return billingCount(f);
      });
      return takeover;
    });
    expect(outcome).toEqual({ ran: true, value: { ran: true, value: 2 } });
    expect(await billingCount(f)).toBe(2);
  });

  it('with cycles, a 15-minute cycle reconciles once across servers: the second server finds it done, the next cycle runs again', async () => {
    const { f } = await twoChannelLab();
    await post(f, [{ channel: 'air_t', ts: T0, value: 1 }]).expect(200);
    // a cycle start of our own far from any other test's, so job_runs rows of other tests never meet it
    let clock = Date.UTC(2031, 0, 6, 9, 0, 0) + f.lab.id * USAGE_JOB_INTERVAL_MS * 4;
    const now = () => new Date(clock);
    const a = jobFor('server-a', now, USAGE_JOB_INTERVAL_MS);
    const b = jobFor('server-b', now, USAGE_JOB_INTERVAL_MS);
    expect(await a.runOnce()).toMatchObject({ ran: true, failed: 0 });
    await t.db('lab_billing').where('tenant_id', f.lab.id).update({ readings_count: 7 }); // drift after the run
    clock += 60_000; // same cycle, a minute later, on the other server
    expect(await b.runOnce()).toEqual({ ran: false, cycleDone: true });
    expect(await billingCount(f)).toBe(7); // nothing reconciled twice in one cycle
    const claimed = await t.db('job_runs').where('name', USAGE_LEASE).where('holder', 'server-a').select('period_start', 'finished_at');
    expect(claimed.some((r) => new Date(r.period_start).getTime() === clock - 60_000 && r.finished_at !== null)).toBe(true);
    clock += USAGE_JOB_INTERVAL_MS; // the next cycle
    expect(await b.runOnce()).toMatchObject({ ran: true, failed: 0 });
    expect(await billingCount(f)).toBe(1);
  });
});
