import type { Knex } from 'knex';
import type { LabScope, DbOrTrx } from './tenant-scope.ts';
import { executeArrays } from './execute-arrays.ts';
import { loadDataRows } from './load-data-rows.ts';

export interface ReadingRow {
  channelId: number;
  ts: number;
  value: number;
}

/** Rollup resolutions in seconds, finest first; each is computed from the one before it. */
export const ROLLUP_RESOLUTIONS_S = [60, 3600, 86400] as const;

/** Groups sorted bucket starts into runs whose neighbours are at most `maxGap` apart. */
function runsOf(sorted: number[], maxGap: number): Array<[number, number]> {
  const runs: Array<[number, number]> = [];
  for (const b of sorted) {
    const last = runs[runs.length - 1];
    if (last && b - last[1] <= maxGap) last[1] = b;
    else runs.push([b, b]);
  }
  return runs;
}

/** Data access for one lab's readings and their rollups. */
export function readingsIn(scope: LabScope, db: DbOrTrx) {
  const tenantId = scope.tenantId;
  return {
    /**
     * Inserts rows, ignoring any (channel, ts) already stored. Returns how many were new.
     * Streams them as LOAD DATA LOCAL INFILE on the caller's connection (numbers only, see
     * load-data-rows.ts); where the server refuses local infile, one bound multi-row INSERT
     * (bindings, never string-built SQL).
     */
    async insertNew(rows: ReadingRow[]): Promise<number> {
      if (rows.length === 0) return 0;
      let tsv = '';
      for (const r of rows) tsv += `${tenantId}\t${r.channelId}\t${r.ts}\t${r.value}\n`;
      const loaded = await loadDataRows(db as Knex, 'readings', ['tenant_id', 'channel_id', 'ts', 'value'], tsv);
      if (loaded !== null) return loaded;
      const values = rows.map((r) => [tenantId, r.channelId, r.ts, r.value]);
      const [result] = await db.raw('INSERT IGNORE INTO readings (tenant_id, channel_id, ts, value) VALUES ?', [values] as never);
      return Number((result as { affectedRows: number }).affectedRows);
    },

    /** The stored values at the given times of one channel (for conflict checks). */
    async storedAt(channelId: number, times: number[]): Promise<Map<number, number>> {
      const out = new Map<number, number>();
      for (let i = 0; i < times.length; i += 1000) {
        const chunk = times.slice(i, i + 1000);
        // Binary protocol (on this transaction's connection): exact doubles, so a re-sent value
        // with 17 significant digits is a duplicate, not a conflict.
        const rows = await executeArrays(
          db as Knex,
          `SELECT ts, value FROM readings WHERE tenant_id = ? AND channel_id = ? AND ts IN (${chunk.map(() => '?').join(', ')})`,
          [tenantId, channelId, ...chunk],
        );
        for (const r of rows) out.set(Number(r[0]), Number(r[1]));
      }
      return out;
    },

    /**
     * Adds freshly inserted readings to their rollup buckets at every resolution, computing
     * each bucket's min, max, sum and count from the rows in hand and merging them into what
     * is stored (LEAST, GREATEST, +). Exact only when every row given was new — the caller
     * uses `refreshRollups` otherwise. One statement for every resolution, no scan of readings.
     */
    async addToRollups(rows: ReadingRow[]): Promise<void> {
      if (rows.length === 0) return;
      // Rows come sorted by channel, then time, so each bucket is one run of neighbours. (Were
      // they not, a bucket would appear more than once; the upsert below merges such repeats
      // correctly, only less cheaply.) Every resolution goes into one statement.
      const values: Array<[number, number, number, number, number, number, number, number]> = [];
      for (const res of ROLLUP_RESOLUTIONS_S) {
        const ms = res * 1000;
        let open: (typeof values)[number] | null = null;
        for (const r of rows) {
          const b = r.ts - (((r.ts % ms) + ms) % ms);
          if (open && open[1] === r.channelId && open[3] === b) {
            if (r.value < open[4]) open[4] = r.value;
            if (r.value > open[5]) open[5] = r.value;
            open[6] += r.value;
            open[7] += 1;
          } else {
            open = [tenantId, r.channelId, res, b, r.value, r.value, r.value, 1];
            values.push(open);
          }
        }
      }
      await db.raw(
        `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
         VALUES ?
         ON DUPLICATE KEY UPDATE min_value = LEAST(min_value, VALUES(min_value)), max_value = GREATEST(max_value, VALUES(max_value)),
           sum_value = sum_value + VALUES(sum_value), count_value = count_value + VALUES(count_value)`,
        [values] as never,
      );
    },

    /**
     * Recomputes the rollups of the buckets these times fall in, for these channels: minute
     * buckets from raw readings, hours from minutes, days from hours. Recomputing (rather than
     * adding) keeps rollups exact and idempotent whatever was inserted before; runs of touched
     * buckets are scanned together, so a live batch costs one statement per resolution.
     */
    async refreshRollups(channelIds: number[], times: number[]): Promise<void> {
      if (times.length === 0 || channelIds.length === 0) return;
      let source: 'raw' | number = 'raw';
      for (const res of ROLLUP_RESOLUTIONS_S) {
        const ms = res * 1000;
        const buckets = [...new Set(times.map((t) => t - (((t % ms) + ms) % ms)))].sort((a, b) => a - b);
        for (const [first, last] of runsOf(buckets, ms * 4)) {
          const range = [tenantId, ...channelIds, first, last + ms];
          const inList = channelIds.map(() => '?').join(', ');
          if (source === 'raw') {
            await db.raw(
              `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
               SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
               FROM readings WHERE tenant_id = ? AND channel_id IN (${inList}) AND ts >= ? AND ts < ?
               GROUP BY channel_id, b
               ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                 sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
              [res, ms, ...range],
            );
          } else {
            await db.raw(
              `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
               SELECT tenant_id, channel_id, ?, bucket_start - MOD(bucket_start, ?) AS b, MIN(min_value), MAX(max_value), SUM(sum_value), SUM(count_value)
               FROM reading_rollups WHERE tenant_id = ? AND resolution_s = ? AND channel_id IN (${inList}) AND bucket_start >= ? AND bucket_start < ?
               GROUP BY channel_id, b
               ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                 sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
              [res, ms, tenantId, source, ...channelIds, first, last + ms],
            );
          }
        }
        source = res;
      }
    },
  };
}

export type ReadingsRepo = ReturnType<typeof readingsIn>;
