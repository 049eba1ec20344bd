import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import {
  addMonths,
  detachedTableName,
  dropDetachedLeftovers,
  dropPartition,
  ensureMonthsFrom,
  ensureMonthsUpTo,
  listPartitions,
  monthPartitionName,
  monthStartOf,
  PartitionNameError,
  rowsPerChannel,
} from '../../server/db/reading-partitions.ts';
import { testConfig } from '../support/test-app.ts';

/**
 * The partition primitives other jobs build on (retention drops months with them; the storage
 * job makes months ahead), on a scratch database of their own so no other suite's rows move.
 * Counts are checked against plain `GROUP BY` queries over the time range, not the partition.
 */
const config = testConfig();
const scratch = `${config.db.database}_reading_partitions`;
let admin: Db;
let db: Db;
const now = Date.now();
const thisMonth = monthStartOf(now);

const countIn = async (from: number, to: number) => Number((await db('readings').where('ts', '>=', from).where('ts', '<', to).count({ n: '*' }))[0].n);

beforeAll(async () => {
  admin = createDb(config.db);
  await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin.raw(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = createDb({ ...config.db, database: scratch });
  await migrateToLatest(db);
}, 60_000);
afterAll(async () => {
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin?.destroy();
});

describe('reading partitions', () => {
  it('a fresh database has p_before, the current month to three ahead, and p_future, contiguous', async () => {
    for (const table of ['readings', 'reading_rollups'] as const) {
      const parts = await listPartitions(db, table);
      expect(parts.map((p) => p.name)).toEqual(['p_before', ...[0, 1, 2, 3].map((k) => monthPartitionName(addMonths(thisMonth, k))), 'p_future']);
      expect(parts.map((p) => p.kind)).toEqual(['before', 'month', 'month', 'month', 'month', 'future']);
      for (let i = 1; i < parts.length; i++) expect(parts[i].monthStart).toBe(parts[i - 1].monthEnd);
      expect(parts[1]).toMatchObject({ table, monthStart: thisMonth, monthEnd: addMonths(thisMonth, 1) });
    }
  });

  it('rowsPerChannel counts each lab and channel of one month; dropping that month removes exactly its rows', async () => {
    const m0 = addMonths(thisMonth, -2);
    const m1 = addMonths(thisMonth, -1);
    expect(await ensureMonthsFrom(db, 'readings', m0)).toEqual([monthPartitionName(m0), monthPartitionName(m1)]);
    const rows: Array<{ tenant_id: number; channel_id: number; ts: number; value: number }> = [];
    const add = (lab: number, channel: number, from: number, n: number) => {
      for (let i = 0; i < n; i++) rows.push({ tenant_id: lab, channel_id: channel, ts: from + i * 60_000, value: i / 3 });
    };
    add(1, 10, m0, 500);
    add(1, 11, m0 + 3_600_000, 120);
    add(2, 20, m0, 77);
    add(1, 10, m1, 300);
    add(2, 20, thisMonth - 30 * 60_000, 60); // straddles the month end: 30 in m1, 30 in this month
    add(3, 30, m0 - 86_400_000, 5); // before the first month
    for (let i = 0; i < rows.length; i += 1000) await db('readings').insert(rows.slice(i, i + 1000));

    const grouped = (await db('readings')
      .where('ts', '>=', m0)
      .where('ts', '<', m1)
      .groupBy('tenant_id', 'channel_id')
      .orderBy(['tenant_id', 'channel_id'])
      .select('tenant_id', 'channel_id')
      .count({ n: '*' })) as unknown as Array<{ tenant_id: number; channel_id: number; n: number }>;
    const expected = grouped.map((r) => ({ tenantId: Number(r.tenant_id), channelId: Number(r.channel_id), rows: Number(r.n) }));
    expect(expected).toEqual([
      { tenantId: 1, channelId: 10, rows: 500 },
      { tenantId: 1, channelId: 11, rows: 120 },
      { tenantId: 2, channelId: 20, rows: 77 },
    ]);
    expect(await rowsPerChannel(db, 'readings', monthPartitionName(m0))).toEqual(expected);
    expect(await rowsPerChannel(db, 'readings', 'p_before')).toEqual([{ tenantId: 3, channelId: 30, rows: 5 }]);

    const laterBefore = await countIn(m1, addMonths(thisMonth, 1));
    await dropPartition(db, 'readings', monthPartitionName(m0));
    expect(await countIn(m0, m1)).toBe(0);
    expect(await countIn(m1, addMonths(thisMonth, 1))).toBe(laterBefore);
    expect((await listPartitions(db, 'readings')).map((p) => p.name)).not.toContain(monthPartitionName(m0));
    // the month was detached, then its table removed: nothing is left behind
    expect(await db.schema.hasTable(detachedTableName('readings', monthPartitionName(m0)))).toBe(false);
    // a crash between detaching and removing leaves the detached table: the leftover sweep removes it (and nothing else)
    await db.raw('CREATE TABLE ?? LIKE ??', [detachedTableName('readings', 'p202001'), 'reading_rollups']);
    await db.raw('CREATE TABLE ?? (id INT PRIMARY KEY)', ['readings_gone_notes']);
    expect(await dropDetachedLeftovers(db)).toEqual([detachedTableName('readings', 'p202001')]);
    expect(await db.schema.hasTable('readings_gone_notes')).toBe(true);
    await db.schema.dropTable('readings_gone_notes');

    // the catch-all is emptied, not removed: older rows still have a place
    await dropPartition(db, 'readings', 'p_before');
    expect(await countIn(0, m0)).toBe(0);
    expect((await listPartitions(db, 'readings'))[0].kind).toBe('before');
    await db('readings').insert({ tenant_id: 3, channel_id: 30, ts: m0 - 86_400_000, value: 1 });
    expect(await countIn(0, m0)).toBe(1);
  });

  it('refuses names that are not ours and changes nothing', async () => {
    const before = await listPartitions(db, 'readings');
    await expect(dropPartition(db, 'readings', 'p_future')).rejects.toBeInstanceOf(PartitionNameError);
    await expect(dropPartition(db, 'readings', 'p202611 ; DROP TABLE labs')).rejects.toBeInstanceOf(PartitionNameError);
    await expect(rowsPerChannel(db, 'readings', 'readings')).rejects.toBeInstanceOf(PartitionNameError);
    expect(await listPartitions(db, 'readings')).toEqual(before);
  });

  it('making months ahead keeps rows already in p_future and puts them in their months', async () => {
    const far = addMonths(thisMonth, 5);
    await db('readings').insert({ tenant_id: 4, channel_id: 40, ts: far + 1000, value: 2.5 });
    expect(await rowsPerChannel(db, 'readings', 'p_future')).toEqual([{ tenantId: 4, channelId: 40, rows: 1 }]);
    expect(await ensureMonthsUpTo(db, 'readings', far)).toEqual([monthPartitionName(addMonths(thisMonth, 4)), monthPartitionName(far)]);
    expect(await rowsPerChannel(db, 'readings', monthPartitionName(far))).toEqual([{ tenantId: 4, channelId: 40, rows: 1 }]);
    expect(await rowsPerChannel(db, 'readings', 'p_future')).toEqual([]);
    expect(await ensureMonthsUpTo(db, 'readings', far)).toEqual([]);
  });
});
