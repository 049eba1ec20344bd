/**
 * "Today" in `npm run bench:storage`: readings and rollups as Lagbook stored them at commit
 * c9ea3ba, before issue #20 — plain (uncompressed, unpartitioned) InnoDB tables, and minute,
 * hour and day rollups for every channel — loaded with the statements that ingestion wrote then,
 * so the benchmark compares the new storage with the old in the same run on the same server.
 *
 * The DDL below is that of c9ea3ba:migrations/20261202001000_create-readings.ts and
 * …001100_create-reading-rollups.ts; the rollup fold and upsert are those of
 * c9ea3ba:server/db/readings.repo.ts `addToRollups`; the reads are those of
 * c9ea3ba:server/db/channel-readings.repo.ts (`range`, `rollupBuckets`) and
 * c9ea3ba:server/db/usage.repo.ts (`storedReadings`). They are copied, not imported, because the
 * current tree has moved on from them.
 */
import { Readable } from 'node:stream';
import mysql from 'mysql2/promise';
import type { ReadingBatch } from './storage-data.ts';

const CREATE_READINGS = `
  CREATE TABLE readings (
    tenant_id BIGINT UNSIGNED NOT NULL,
    channel_id BIGINT UNSIGNED NOT NULL,
    ts BIGINT NOT NULL,
    value DOUBLE NOT NULL,
    PRIMARY KEY (tenant_id, channel_id, ts)
  ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`;

const CREATE_ROLLUPS = `
  CREATE TABLE reading_rollups (
    tenant_id BIGINT UNSIGNED NOT NULL,
    channel_id BIGINT UNSIGNED NOT NULL,
    resolution_s INT UNSIGNED NOT NULL,
    bucket_start BIGINT NOT NULL,
    min_value DOUBLE NOT NULL,
    max_value DOUBLE NOT NULL,
    sum_value DOUBLE NOT NULL,
    count_value INT UNSIGNED NOT NULL,
    PRIMARY KEY (tenant_id, channel_id, resolution_s, bucket_start)
  ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`;

/** Rollup resolutions in seconds at c9ea3ba, finest first; each is folded from the one before. */
const TODAY_RESOLUTIONS_S = [60, 3600, 86400] as const;

type RollupRow = [tenantId: number, channelId: number, resolutionS: number, bucketStart: number, min: number, max: number, sum: number, count: number];

const bucketOf = (t: number, ms: number) => t - (((t % ms) + ms) % ms);

/** One lab's readings in today's schema, in its own database of the benchmark's server. */
export interface TodaySchema {
  conn: mysql.Connection;
  tenantId: number;
  /** Channel id of each channel index. */
  channelIds: number[];
  /** Stores one batch as today's ingestion did: one transaction, LOAD DATA of the readings, then the rollup upsert of all three levels. */
  store(batch: ReadingBatch): Promise<number>;
  /** All raw readings of one channel in [from, to), in time order (today's `range`). */
  rawRange(channelId: number, from: number, to: number): Promise<number>;
  /** Today's series answer for [from, to) at `points` points (see `todaySeries`). */
  series(channelId: number, from: number, to: number, points: number): Promise<number>;
  /** Today's usage reconciliation: the sum of the day rollups' counts. */
  storedReadings(): Promise<number>;
  /** Deletes one month of the lab's readings and rollups as a retention job would have to without partitions. */
  deleteRange(from: number, to: number): Promise<{ readings: number; rollups: number }>;
  close(): Promise<void>;
}

/** Creates `database` with today's two tables and connects to it through the server's socket. */
export async function createTodaySchema(socketPath: string, database: string, channels: number): Promise<TodaySchema> {
  const conn = await mysql.createConnection({ socketPath, user: 'lagbook', password: 'lagbook', flags: ['+LOCAL_FILES'], supportBigNumbers: true });
  await conn.query(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await conn.changeUser({ database });
  await conn.query(CREATE_READINGS);
  await conn.query(CREATE_ROLLUPS);
  // ingestion ran each batch at READ COMMITTED (c9ea3ba:server/services/ingest/ingest-batch.ts)
  await conn.query('SET SESSION TRANSACTION ISOLATION LEVEL READ COMMITTED');
  const tenantId = 1;
  const channelIds = Array.from({ length: channels }, (_, c) => c + 1);

  const rows = async (sql: string, bindings: unknown[]): Promise<unknown[][]> => {
    const [result] = await conn.execute({ sql, rowsAsArray: true }, bindings as never);
    return result as unknown[][];
  };

  return {
    conn,
    tenantId,
    channelIds,
    async store(batch) {
      let tsv = '';
      for (let i = 0; i < batch.length; i++) tsv += `${tenantId}\t${channelIds[batch.channel[i]]}\t${batch.ts[i]}\t${batch.value[i]}\n`;
      await conn.beginTransaction();
      try {
        const [loaded] = await conn.query({
          sql: "LOAD DATA LOCAL INFILE 'lagbook-batch.tsv' IGNORE INTO TABLE readings FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' (tenant_id, channel_id, ts, value)",
          infileStreamFactory: () => Readable.from([Buffer.from(tsv)]),
        });
        await conn.query(
          `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
           VALUES ?
           ON DUPLICATE KEY UPDATE min_value = LEAST(min_value, VALUES(min_value)), max_value = GREATEST(max_value, VALUES(max_value)),
             sum_value = sum_value + VALUES(sum_value), count_value = count_value + VALUES(count_value)`,
          [todayRollupRows(tenantId, channelIds, batch)],
        );
        await conn.commit();
        return Number((loaded as { affectedRows: number }).affectedRows);
      } catch (err) {
        await conn.rollback();
        throw err;
      }
    },
    async rawRange(channelId, from, to) {
      return (
        await rows('SELECT ts, value FROM readings WHERE tenant_id = ? AND channel_id = ? AND ts >= ? AND ts < ? ORDER BY ts', [tenantId, channelId, from, to])
      ).length;
    },
    async series(channelId, from, to, points) {
      // c9ea3ba's series: the raw readings when the range holds at most `points`, else ⌊points/2⌋
      // buckets of the coarsest rollup resolution not wider than a bucket (min/max per bucket)
      const raw = await rows(`SELECT ts, value FROM readings WHERE tenant_id = ? AND channel_id = ? AND ts >= ? AND ts < ? ORDER BY ts LIMIT ${points + 1}`, [
        tenantId,
        channelId,
        from,
        to,
      ]);
      if (raw.length <= points) return raw.length;
      const target = (to - from) / Math.floor(points / 2);
      const resolutionS = [...TODAY_RESOLUTIONS_S].reverse().find((r) => r * 1000 <= target);
      if (!resolutionS) throw new Error('todaySeries: the benchmark reads ranges wide enough for a rollup level');
      const unit = resolutionS * 1000;
      const widthMs = Math.ceil(target / unit) * unit;
      const start = Math.floor(from / widthMs) * widthMs;
      const end = start + Math.ceil((to - start) / widthMs) * widthMs;
      const buckets = await rows(
        `SELECT bucket_start - MOD(bucket_start, ?) AS b, MIN(min_value), MAX(max_value), SUM(sum_value), SUM(count_value)
         FROM reading_rollups WHERE tenant_id = ? AND channel_id = ? AND resolution_s = ? AND bucket_start >= ? AND bucket_start < ?
         GROUP BY b ORDER BY b`,
        [widthMs, tenantId, channelId, resolutionS, start, end],
      );
      return buckets.length;
    },
    async storedReadings() {
      const [n] = await rows('SELECT SUM(count_value) FROM reading_rollups WHERE tenant_id = ? AND resolution_s = 86400', [tenantId]);
      return Number(n[0] ?? 0);
    },
    async deleteRange(from, to) {
      const [r] = await conn.query('DELETE FROM readings WHERE tenant_id = ? AND ts >= ? AND ts < ?', [tenantId, from, to]);
      const [u] = await conn.query('DELETE FROM reading_rollups WHERE tenant_id = ? AND bucket_start >= ? AND bucket_start < ?', [tenantId, from, to]);
      return { readings: (r as { affectedRows: number }).affectedRows, rollups: (u as { affectedRows: number }).affectedRows };
    },
    close: () => conn.end(),
  };
}

/**
 * The rollup rows today's ingestion upserted for a batch of new readings sorted by channel, then
 * time: minute buckets folded from the readings, hours from minutes, days from hours.
 */
export function todayRollupRows(tenantId: number, channelIds: readonly number[], batch: ReadingBatch): RollupRow[] {
  const [finest, ...coarser] = TODAY_RESOLUTIONS_S;
  const finestMs = finest * 1000;
  let level: RollupRow[] = [];
  for (let i = 0; i < batch.length; i++) {
    const channelId = channelIds[batch.channel[i]];
    const v = batch.value[i];
    const b = bucketOf(batch.ts[i], finestMs);
    const open = level[level.length - 1];
    if (open && open[1] === channelId && open[3] === b) {
      if (v < open[4]) open[4] = v;
      if (v > open[5]) open[5] = v;
      open[6] += v;
      open[7] += 1;
    } else level.push([tenantId, channelId, finest, b, v, v, v, 1]);
  }
  const values = level;
  for (const res of coarser) {
    const ms = res * 1000;
    const folded: RollupRow[] = [];
    for (const r of level) {
      const b = bucketOf(r[3], ms);
      const open = folded[folded.length - 1];
      if (open && open[1] === r[1] && open[3] === b) {
        if (r[4] < open[4]) open[4] = r[4];
        if (r[5] > open[5]) open[5] = r[5];
        open[6] += r[6];
        open[7] += r[7];
      } else folded.push([tenantId, r[1], res, b, r[4], r[5], r[6], r[7]]);
    }
    values.push(...folded);
    level = folded;
  }
  return values;
}
