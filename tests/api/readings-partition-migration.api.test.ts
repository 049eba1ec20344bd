import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { LagbookMigrationSource, migrationsDirectory } from '../../server/db/migration-source.ts';
import { listPartitions } from '../../server/db/reading-partitions.ts';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { postBatch } from '../support/posting-logger.ts';
import { down as partitionDown, up as partitionUp } from '../../migrations/20261204110200_partition-compress-readings.ts';

/**
 * The readings/rollups conversion on a database filled by the schema before it (issue #20 item
 * 2): a scratch database is migrated up to the migration before 20261204110200, filled with
 * readings and rollups over several months of 2025–2026 as that schema stores them, then migrated
 * the rest of the way. Every row must come through unchanged, the tables must be partitioned by
 * month from the oldest reading's month and page-compressed, and the ingestion route must store
 * into them. The migration's `down` and a rerun are checked on the same data.
 */
const MIGRATION = '20261204110200_partition-compress-readings';
const config = testConfig();
const scratch = `${config.db.database}_partition_migration`;
let admin: Db;
let db: Db;
let app: TestApp | undefined;
let lab: LabWithEverything;

type Snapshot = { readings: unknown[]; rollups: unknown[] };
async function snapshot(): Promise<Snapshot> {
  return {
    readings: await db('readings').orderBy(['tenant_id', 'channel_id', 'ts']).select('tenant_id', 'channel_id', 'ts', 'value'),
    rollups: await db('reading_rollups').orderBy(['tenant_id', 'channel_id', 'resolution_s', 'bucket_start']).select('*'),
  };
}

async function createOptions(table: string): Promise<string> {
  const row = await db('information_schema.TABLES').where({ TABLE_SCHEMA: scratch, TABLE_NAME: table }).first('CREATE_OPTIONS as o');
  return String(row?.o ?? '');
}

beforeAll(async () => {
  admin = createDb(config.db);
  await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin.raw(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = createDb({ ...config.db, database: scratch });
  const source = new LagbookMigrationSource(migrationsDirectory());
  const before = (await source.getMigrations()).map((f) => source.getMigrationName(f)).filter((n) => n < MIGRATION);
  for (const name of before) await db.migrate.up({ migrationSource: source, tableName: 'knex_migrations', name });
  lab = await buildLabWithEverything(db, { name: 'Freezer farm' });

  // Four channels' worth of readings: one every 10 minutes over June 2025 and August–November 2026, with their rollups.
  const starts = [Date.UTC(2025, 5, 1), Date.UTC(2026, 7, 1), Date.UTC(2026, 8, 1), Date.UTC(2026, 9, 1), Date.UTC(2026, 10, 1)];
  const readings: Array<{ tenant_id: number; channel_id: number; ts: number; value: number }> = [];
  for (const start of starts)
    for (let i = 0; i < 30 * 144; i += 7)
      readings.push({ tenant_id: lab.lab.id, channel_id: lab.ids.channelId, ts: start + i * 600_000, value: Math.round(Math.cos(i / 90) * 4000) / 1000 - 18 });
  for (let i = 0; i < readings.length; i += 2000) await db('readings').insert(readings.slice(i, i + 2000));
  const hourly = new Map<number, { min: number; max: number; sum: number; n: number }>();
  for (const r of readings) {
    const b = Math.floor(r.ts / 3_600_000) * 3_600_000;
    const h = hourly.get(b) ?? { min: Infinity, max: -Infinity, sum: 0, n: 0 };
    hourly.set(b, { min: Math.min(h.min, r.value), max: Math.max(h.max, r.value), sum: h.sum + r.value, n: h.n + 1 });
  }
  const rollups = [...hourly].map(([b, h]) => ({
    tenant_id: lab.lab.id,
    channel_id: lab.ids.channelId,
    resolution_s: 3600,
    bucket_start: b,
    min_value: h.min,
    max_value: h.max,
    sum_value: h.sum,
    count_value: h.n,
  }));
  for (let i = 0; i < rollups.length; i += 2000) await db('reading_rollups').insert(rollups.slice(i, i + 2000));
}, 120_000);

afterAll(async () => {
  await app?.close();
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin?.destroy();
});

describe('partitioning and compressing an existing database', () => {
  it('keeps every reading and rollup unchanged, partitions both tables by month from the oldest reading, compresses them; down and a rerun keep the rows too', async () => {
    const before = await snapshot();
    expect(before.readings.length).toBeGreaterThan(3000);
    expect(await listPartitions(db, 'readings')).toEqual([]);

    await migrateToLatest(db);
    expect(await snapshot()).toEqual(before);
    for (const table of ['readings', 'reading_rollups'] as const) {
      const parts = await listPartitions(db, table);
      expect(parts[0]).toMatchObject({ kind: 'before', monthEnd: Date.UTC(2025, 5, 1) });
      expect(parts[1]).toMatchObject({ kind: 'month', name: 'p202506', monthStart: Date.UTC(2025, 5, 1), monthEnd: Date.UTC(2025, 6, 1) });
      expect(parts[parts.length - 1].kind).toBe('future');
      const months = parts.filter((p) => p.kind === 'month');
      // through three months after the current one
      const now = new Date();
      expect(months[months.length - 1].monthStart).toBe(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() + 3, 1));
      expect(await createOptions(table)).toContain('PAGE_COMPRESSED');
      expect(await createOptions(table)).toContain('partitioned');
    }
    // the rows sit in their own months
    const [june] = (await db.raw('SELECT COUNT(*) AS n FROM readings PARTITION (p202506)')) as [Array<{ n: number }>];
    expect(Number(june[0].n)).toBe(before.readings.filter((r) => (r as { ts: number }).ts < Date.UTC(2025, 6, 1)).length);

    await partitionDown(db);
    expect(await listPartitions(db, 'readings')).toEqual([]);
    expect(await createOptions('readings')).not.toContain('PAGE_COMPRESSED');
    expect(await snapshot()).toEqual(before);
    await partitionUp(db);
    await partitionUp(db); // a rerun leaves a converted table alone
    expect((await listPartitions(db, 'readings'))[1].name).toBe('p202506');
    expect(await snapshot()).toEqual(before);
  });

  it('the ingestion route stores into the partitioned table', async () => {
    app = await buildTestApp({ db: { ...config.db, database: scratch } });
    const url = await app.listen();
    const t0 = Date.UTC(2026, 11, 2);
    const body = JSON.stringify({ readings: Array.from({ length: 120 }, (_, i) => ({ channel: 'air_t', ts: t0 + i * 60_000, value: -19.5 + i / 100 })) });
    const res = await postBatch(url, lab.ingestKey, body);
    expect(res.status, await res.clone().text()).toBe(200);
    const [rows] = (await db.raw('SELECT COUNT(*) AS n FROM readings PARTITION (p202612) WHERE ts >= ?', [t0])) as [Array<{ n: number }>];
    expect(Number(rows[0].n)).toBe(120);
  });
});
