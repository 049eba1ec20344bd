import type { LabScope } from './tenant-scope.ts';
import { loadDataRows } from './load-data-rows.ts';

/**
 * Readings in columns, `length` of them: reading i is (channelId[i], ts[i], value[i]), ts in
 * epoch ms. Batches are handed over this way rather than as one object per reading (see
 * services/ingest/batch-candidates.ts).
 */
export interface ReadingBatchColumns {
  length: number;
  channelId: Float64Array;
  ts: Float64Array;
  value: Float64Array;
}

/** Readings from..to (exclusive) of `cols`, as views on the same memory. */
export function sliceColumns(cols: ReadingBatchColumns, from: number, to: number): ReadingBatchColumns {
  return { length: to - from, channelId: cols.channelId.subarray(from, to), ts: cols.ts.subarray(from, to), value: cols.value.subarray(from, to) };
}

type RollupRow = [tenantId: number, channelId: number, resolutionS: number, bucketStart: number, min: number, max: number, sum: number, count: number];

/** Start of the bucket of width `ms` that holds `t` (floor, also for times before 1970). */
const bucketOf = (t: number, ms: number) => t - (((t % ms) + ms) % ms);

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

/**
 * Data access for one lab's readings and their rollups, on the scope's connection (the batch's
 * transaction during ingestion). Rows written carry the scope's lab id, stamped here as
 * `scope.insert` stamps it; every statement that reads or filters binds it through `:lab`.
 */
export function readingsRepo(scope: LabScope) {
  const { tenantId, db } = scope;
  return {
    /**
     * Inserts rows, ignoring any (channel, ts) already stored. Returns how many were new.
     * Streams them as LOAD DATA LOCAL INFILE on the caller's connection (numbers only, see
     * load-data-rows.ts); where the server refuses local infile, one bound multi-row INSERT
     * (bindings, never string-built SQL).
     */
    async insertNew(rows: ReadingBatchColumns): Promise<number> {
      if (rows.length === 0) return 0;
      let tsv = '';
      let prefix = '';
      let prefixFor = Number.NaN;
      for (let i = 0; i < rows.length; i++) {
        const channelId = rows.channelId[i];
        if (channelId !== prefixFor) {
          prefixFor = channelId;
          prefix = `${tenantId}\t${channelId}\t`;
        }
        tsv += `${prefix}${rows.ts[i]}\t${rows.value[i]}\n`;
      }
      const loaded = await loadDataRows(db, 'readings', ['tenant_id', 'channel_id', 'ts', 'value'], tsv);
      if (loaded !== null) return loaded;
      const values = Array.from({ length: rows.length }, (_, i) => [tenantId, rows.channelId[i], rows.ts[i], rows.value[i]]);
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
        const rows = await scope.arrays(
          `SELECT ts, value FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts IN (${chunk.map(() => '?').join(', ')})`,
          [channelId, ...chunk],
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
    async addToRollups(rows: ReadingBatchColumns): Promise<void> {
      if (rows.length === 0) return;
      // Rows come sorted by channel, then time, so each minute bucket is one run of neighbours
      // (were they not, a bucket would appear more than once; the upsert below merges such
      // repeats correctly, only less cheaply). Each coarser resolution folds the one before it.
      const [finest, ...coarser] = ROLLUP_RESOLUTIONS_S;
      let level: RollupRow[] = [];
      const finestMs = finest * 1000;
      for (let i = 0; i < rows.length; i++) {
        const channelId = rows.channelId[i];
        const v = rows.value[i];
        const b = bucketOf(rows.ts[i], finestMs);
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
        const buckets = [...new Set(times.map((t) => bucketOf(t, ms)))].sort((a, b) => a - b);
        for (const [first, last] of runsOf(buckets, ms * 4)) {
          const range = [...channelIds, first, last + ms];
          const inList = channelIds.map(() => '?').join(', ');
          if (source === 'raw') {
            await scope.raw(
              `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
               SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
               FROM readings WHERE tenant_id = :lab AND channel_id IN (${inList}) AND ts >= ? AND ts < ?
               GROUP BY channel_id, b
               ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                 sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
              [res, ms, ...range],
            );
          } else {
            await scope.raw(
              `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
               SELECT tenant_id, channel_id, ?, bucket_start - MOD(bucket_start, ?) AS b, MIN(min_value), MAX(max_value), SUM(sum_value), SUM(count_value)
               FROM reading_rollups WHERE tenant_id = :lab AND resolution_s = ? AND channel_id IN (${inList}) AND bucket_start >= ? AND bucket_start < ?
               GROUP BY channel_id, b
               ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                 sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
              [res, ms, source, ...channelIds, first, last + ms],
            );
          }
        }
        source = res;
      }
    },
  };
}

export type ReadingsRepo = ReturnType<typeof readingsRepo>;
