import type { LabScope } from './tenant-scope.ts';
import { loadDataRows } from './load-data-rows.ts';
import { finestRollupFor, keptLevels, ROLLUP_RESOLUTIONS_S } from './rollup-levels.ts';

export { ROLLUP_RESOLUTIONS_S } from './rollup-levels.ts';

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

/** The channels of a batch, each once (rows come grouped by channel, so this is one pass). */
function distinctChannels(rows: ReadingBatchColumns): number[] {
  const ids = new Set<number>();
  for (let i = 0; i < rows.length; i++) ids.add(rows.channelId[i]);
  return [...ids];
}

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

  /**
   * The finest rollup level each channel's writers keep — one keyed look-up: the finer of the
   * stored floor (`channels.finest_rollup_s`, what readers use) and the one its reporting
   * interval calls for. After an edit to a shorter interval new readings thus feed the newly
   * kept level at once while its history is built, and readers switch to it only once it is
   * whole (see services/rollup-levels.service.ts); after an edit to a longer one the stored
   * floor is raised in the edit's transaction and writers follow.
   */
  async function writeFloors(channelIds: number[]): Promise<Map<number, number | null>> {
    const out = new Map<number, number | null>();
    if (channelIds.length === 0) return out;
    const rows = await scope.arrays(
      `SELECT c.id, c.finest_rollup_s, COALESCE(c.expected_interval_s, l.expected_interval_s) FROM channels c
       JOIN loggers l ON l.tenant_id = c.tenant_id AND l.id = c.logger_id
       WHERE c.tenant_id = :lab AND c.id IN (${channelIds.map(() => '?').join(', ')})`,
      channelIds,
    );
    for (const r of rows) {
      const stored = r[1] === null ? null : Number(r[1]);
      // An interval the schema cannot hold (none, zero) keeps every level: safe, only larger.
      const wanted = Number(r[2]) > 0 ? finestRollupFor(Number(r[2])) : ROLLUP_RESOLUTIONS_S[0];
      out.set(Number(r[0]), stored === null ? wanted : wanted === null ? stored : Math.min(stored, wanted));
    }
    return out;
  }

  /** Buckets of `ms` (level `res`) summed from rows from..to of one channel, in time order. */
  function bucketsFromRows(rows: ReadingBatchColumns, from: number, to: number, ms: number, res: number): RollupRow[] {
    const level: RollupRow[] = [];
    for (let i = from; i < to; i++) {
      const v = rows.value[i];
      const b = bucketOf(rows.ts[i], ms);
      const open = level[level.length - 1];
      if (open && open[3] === b) {
        if (v < open[4]) open[4] = v;
        if (v > open[5]) open[5] = v;
        open[6] += v;
        open[7] += 1;
      } else level.push([tenantId, rows.channelId[i], res, b, v, v, v, 1]);
    }
    return level;
  }

  /** One channel's rollups folded into the coarser level `res`. */
  function foldLevel(level: RollupRow[], res: number): RollupRow[] {
    const ms = res * 1000;
    const folded: RollupRow[] = [];
    for (const r of level) {
      const b = bucketOf(r[3], ms);
      const open = folded[folded.length - 1];
      if (open && open[3] === b) {
        if (r[4] < open[4]) open[4] = r[4];
        if (r[5] > open[5]) open[5] = r[5];
        open[6] += r[6];
        open[7] += r[7];
      } else folded.push([tenantId, r[1], res, b, r[4], r[5], r[6], r[7]]);
    }
    return folded;
  }

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
     * Adds freshly inserted readings to their rollup buckets at each level their channel keeps
     * (see rollup-levels.ts), computing each bucket's min, max, sum and count from the rows in
     * hand and merging them into what is stored (LEAST, GREATEST, +). Exact only when every row
     * given was new — the caller uses `refreshRollups` otherwise. One keyed look-up of the
     * channels' levels and one statement for every level, no scan of readings.
     */
    async addToRollups(rows: ReadingBatchColumns): Promise<void> {
      if (rows.length === 0) return;
      const floors = await writeFloors(distinctChannels(rows));
      const values: RollupRow[] = [];
      // Rows come sorted by channel, then time, so each bucket is one run of neighbours (were
      // they not, a bucket would appear more than once; the upsert below merges such repeats
      // correctly, only less cheaply). A channel's finest kept level is summed from its rows,
      // each coarser one folds the level before it.
      for (let from = 0; from < rows.length;) {
        const channelId = rows.channelId[from];
        let to = from + 1;
        while (to < rows.length && rows.channelId[to] === channelId) to++;
        const [finest, ...coarser] = keptLevels(floors.get(channelId) ?? null);
        if (finest !== undefined) {
          let level = bucketsFromRows(rows, from, to, finest * 1000, finest);
          values.push(...level);
          for (const res of coarser) {
            level = foldLevel(level, res);
            values.push(...level);
          }
        }
        from = to;
      }
      if (values.length === 0) return;
      await db.raw(
        `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
         VALUES ?
         ON DUPLICATE KEY UPDATE min_value = LEAST(min_value, VALUES(min_value)), max_value = GREATEST(max_value, VALUES(max_value)),
           sum_value = sum_value + VALUES(sum_value), count_value = count_value + VALUES(count_value)`,
        [values] as never,
      );
    },

    /**
     * Recomputes the rollups of the buckets these times fall in, for these channels, at the
     * levels each keeps: its finest level from raw readings, each coarser one from the level
     * before it. Recomputing (rather than adding) keeps rollups exact and idempotent whatever
     * was inserted before; runs of touched buckets are scanned together, so a live batch costs
     * one statement per level and group of channels sharing a finest level.
     */
    async refreshRollups(channelIds: number[], times: number[]): Promise<void> {
      if (times.length === 0 || channelIds.length === 0) return;
      const floors = await writeFloors(channelIds);
      const byFloor = new Map<number, number[]>();
      for (const id of new Set(channelIds)) {
        const floor = floors.get(id) ?? null;
        if (floor !== null) byFloor.set(floor, [...(byFloor.get(floor) ?? []), id]);
      }
      for (const [floor, ids] of byFloor) {
        const inList = ids.map(() => '?').join(', ');
        let source: 'raw' | number = 'raw';
        for (const res of keptLevels(floor)) {
          const ms = res * 1000;
          const buckets = [...new Set(times.map((t) => bucketOf(t, ms)))].sort((a, b) => a - b);
          for (const [first, last] of runsOf(buckets, ms * 4)) {
            if (source === 'raw') {
              await scope.raw(
                `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
                 SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
                 FROM readings WHERE tenant_id = :lab AND channel_id IN (${inList}) AND ts >= ? AND ts < ?
                 GROUP BY channel_id, b
                 ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                   sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
                [res, ms, ...ids, first, last + ms],
              );
            } else {
              await scope.raw(
                `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
                 SELECT tenant_id, channel_id, ?, bucket_start - MOD(bucket_start, ?) AS b, MIN(min_value), MAX(max_value), SUM(sum_value), SUM(count_value)
                 FROM reading_rollups WHERE tenant_id = :lab AND resolution_s = ? AND channel_id IN (${inList}) AND bucket_start >= ? AND bucket_start < ?
                 GROUP BY channel_id, b
                 ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
                   sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
                [res, ms, source, ...ids, first, last + ms],
              );
            }
          }
          source = res;
        }
      }
    },
  };
}

export type ReadingsRepo = ReturnType<typeof readingsRepo>;
