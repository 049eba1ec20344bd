import type { LabScope } from './tenant-scope.ts';
import { isKept } from './rollup-levels.ts';

const HOUR_S = 3600;

/** One channel's readings in time order, as typed arrays (epoch ms, values). */
export interface ReadingColumns {
  ts: Float64Array;
  values: Float64Array;
}

/** A summary per bucket of `widthMs` (bucket start, min, max, sum and count of the readings). */
export interface BucketRow {
  start: number;
  min: number;
  max: number;
  sum: number;
  count: number;
}

export type CellAggregate = 'mean' | 'min' | 'max';

const toColumns = (rows: unknown[][]): ReadingColumns => {
  const ts = new Float64Array(rows.length);
  const values = new Float64Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    ts[i] = Number(rows[i][0]);
    values[i] = Number(rows[i][1]);
  }
  return { ts, values };
};

/** Joins column slices read in time order. */
function concatColumns(parts: ReadingColumns[]): ReadingColumns {
  if (parts.length === 1) return parts[0];
  const length = parts.reduce((sum, p) => sum + p.ts.length, 0);
  const ts = new Float64Array(length);
  const values = new Float64Array(length);
  let at = 0;
  for (const p of parts) {
    ts.set(p.ts, at);
    values.set(p.values, at);
    at += p.ts.length;
  }
  return { ts, values };
}

/**
 * [from, to) cut into at most `maxSlices` slices of at least `sliceSteps` steps each (one slice
 * when the range is shorter than two). Inner boundaries fall on whole multiples of `stepMs`
 * since the epoch, where the grid's cells begin, so no cell is split between two slices.
 */
export function rangeSlices(from: number, to: number, stepMs: number, sliceSteps: number, maxSlices: number): Array<[number, number]> {
  const steps = Math.ceil((to - from) / stepMs);
  const count = Math.max(1, Math.min(maxSlices, Math.floor(steps / sliceSteps)));
  const bounds = [from];
  for (let i = 1; i < count; i++) bounds.push(Math.ceil((from + (i * (to - from)) / count) / stepMs) * stepMs);
  bounds.push(to);
  const slices: Array<[number, number]> = [];
  for (let i = 0; i < count; i++) if (bounds[i] < bounds[i + 1]) slices.push([bounds[i], bounds[i + 1]]);
  return slices;
}

export interface ChannelReadingsOptions {
  /**
   * Grid reads of at least twice this many steps are split into slices read concurrently, each
   * on its own connection (default 50,000): MariaDB scans one statement on one thread, so
   * two slices of a 100,000-cell range come back in about two thirds of the time on two cores.
   */
  sliceSteps?: number;
  /** At most this many slices per read (default 4). */
  maxSlices?: number;
}

const toBuckets = (rows: unknown[][]): BucketRow[] =>
  rows.map((r) => ({ start: Number(r[0]), min: Number(r[1]), max: Number(r[2]), sum: Number(r[3]), count: Number(r[4]) }));

/**
 * Read-only access to one lab's readings and rollups for charts, exports and diagnostics. Rows
 * come back as arrays through the binary protocol (exact doubles, and about twice as fast to
 * read as objects). Every statement leads with the lab's tenant id, as the keys do; the scope
 * binds it (`:lab`). Build it on a scope over the Knex instance, not a transaction, for the
 * concurrent slices to get a connection each.
 */
export function channelReadingsRepo(scope: LabScope, options: ChannelReadingsOptions = {}) {
  const arrays = (sql: string, bindings: unknown[]) => scope.arrays(sql, bindings);
  const sliceSteps = options.sliceSteps ?? 50_000;
  const maxSlices = options.maxSlices ?? 4;

  /** Raw readings with from ≤ ts < to, in time order, at most `limit` of them. */
  async function range(channelId: number, from: number, to: number, limit?: number): Promise<ReadingColumns> {
    if (limit !== undefined && !(Number.isSafeInteger(limit) && limit > 0)) throw new Error(`range: limit must be a positive integer (got ${limit})`);
    // LIMIT takes no DOUBLE placeholder in a prepared statement; the checked integer is inlined.
    const sql = `SELECT ts, value FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts >= ? AND ts < ? ORDER BY ts${limit ? ` LIMIT ${limit}` : ''}`;
    return toColumns(await arrays(sql, [channelId, from, to]));
  }

  /** [from, to) read by `readSlice` in concurrent slices of a grid of `stepMs` (see `sliceSteps`), joined in order. */
  async function rollupFloors(channelIds: number[]): Promise<Map<number, number | null>> {
    const out = new Map<number, number | null>();
    if (channelIds.length === 0) return out;
    const rows = await arrays(
      `SELECT id, finest_rollup_s FROM channels WHERE tenant_id = :lab AND id IN (${channelIds.map(() => '?').join(', ')})`,
      channelIds,
    );
    for (const r of rows) out.set(Number(r[0]), r[1] === null ? null : Number(r[1]));
    return out;
  }

  async function inSlices(from: number, to: number, stepMs: number, readSlice: (a: number, b: number) => Promise<ReadingColumns>): Promise<ReadingColumns> {
    return concatColumns(await Promise.all(rangeSlices(from, to, stepMs, sliceSteps, maxSlices).map(([a, b]) => readSlice(a, b))));
  }

  return {
    range,

    /**
     * Raw readings with from ≤ ts < to, in time order, for a grid of `stepMs` cells: a range of
     * many steps is read as concurrent slices, like `cellsFromRollups`.
     */
    async rangeForGrid(channelId: number, from: number, to: number, stepMs: number): Promise<ReadingColumns> {
      return inSlices(from, to, stepMs, (a, b) => range(channelId, a, b));
    },

    /** Raw readings summarised per bucket of `widthMs` (aligned to whole multiples since the epoch). */
    async rawBuckets(channelId: number, from: number, to: number, widthMs: number): Promise<BucketRow[]> {
      return toBuckets(
        await arrays(
          `SELECT ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
           FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts >= ? AND ts < ?
           GROUP BY b ORDER BY b`,
          [widthMs, channelId, from, to],
        ),
      );
    },

    /** Rollups of `resolutionS` merged into buckets of `widthMs` (a multiple of the resolution). */
    async rollupBuckets(channelId: number, resolutionS: number, from: number, to: number, widthMs: number): Promise<BucketRow[]> {
      return toBuckets(
        await arrays(
          `SELECT bucket_start - MOD(bucket_start, ?) AS b, MIN(min_value), MAX(max_value), SUM(sum_value), SUM(count_value)
           FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s = ? AND bucket_start >= ? AND bucket_start < ?
           GROUP BY b ORDER BY b`,
          [widthMs, channelId, resolutionS, from, to],
        ),
      );
    },

    /**
     * One value per grid cell of `stepMs` from the rollups of `resolutionS` (the step a multiple
     * of it): the exact mean (Σsum / Σcount), min or max of the readings in the cell.
     */
    async cellsFromRollups(channelId: number, resolutionS: number, from: number, to: number, stepMs: number, agg: CellAggregate): Promise<ReadingColumns> {
      // One rollup per cell: read the cells straight off the key, with no grouping (the grouped
      // form costs a temporary table, ≈ 0.4 s for 100,000 cells). Same numbers: a sum over one
      // row is that row.
      const single = agg === 'mean' ? 'sum_value / count_value' : agg === 'min' ? 'min_value' : 'max_value';
      const grouped = agg === 'mean' ? 'SUM(sum_value) / SUM(count_value)' : agg === 'min' ? 'MIN(min_value)' : 'MAX(max_value)';
      const where = 'FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s = ? AND bucket_start >= ? AND bucket_start < ?';
      return inSlices(from, to, stepMs, async (a, b) =>
        toColumns(
          stepMs === resolutionS * 1000
            ? await arrays(`SELECT bucket_start, ${single} ${where} ORDER BY bucket_start`, [channelId, resolutionS, a, b])
            : await arrays(`SELECT bucket_start - MOD(bucket_start, ?) AS b, ${grouped} ${where} GROUP BY b ORDER BY b`, [
                stepMs,
                channelId,
                resolutionS,
                a,
                b,
              ]),
        ),
      );
    },

    /**
     * The finest rollup level each channel keeps (`channels.finest_rollup_s`; null: none), one
     * keyed look-up. A level is readable for a channel only at or above it (rollup-levels.ts).
     */
    rollupFloors,

    /**
     * Hourly means of the given hours for these channels: from the hour rollups of channels
     * that keep them (one statement on the primary key: tenant → channel → resolution → hour),
     * from the raw readings grouped by hour for the others (channels reporting hourly or
     * slower, a reading or less per hour).
     */
    async hourlyMeans(channelIds: number[], fromHour: number, toHour: number): Promise<Array<{ channelId: number; hour: number; mean: number }>> {
      if (channelIds.length === 0) return [];
      const floors = await rollupFloors(channelIds);
      const fromRollups = channelIds.filter((id) => isKept(HOUR_S, floors.get(id) ?? null));
      const fromRaw = channelIds.filter((id) => !isKept(HOUR_S, floors.get(id) ?? null));
      const inList = (ids: number[]) => ids.map(() => '?').join(', ');
      const [rolled, raw] = await Promise.all([
        fromRollups.length === 0
          ? []
          : arrays(
              `SELECT channel_id, bucket_start, sum_value / count_value FROM reading_rollups
               WHERE tenant_id = :lab AND channel_id IN (${inList(fromRollups)}) AND resolution_s = ${HOUR_S} AND bucket_start >= ? AND bucket_start < ?`,
              [...fromRollups, fromHour, toHour],
            ),
        fromRaw.length === 0
          ? []
          : arrays(
              `SELECT channel_id, ts - MOD(ts, ${HOUR_S * 1000}) AS h, SUM(value) / COUNT(*) FROM readings
               WHERE tenant_id = :lab AND channel_id IN (${inList(fromRaw)}) AND ts >= ? AND ts < ? GROUP BY channel_id, h`,
              [...fromRaw, fromHour, toHour],
            ),
      ]);
      return [...rolled, ...raw].map((r) => ({ channelId: Number(r[0]), hour: Number(r[1]), mean: Number(r[2]) }));
    },

    /**
     * Reading count and the first reading's time: the count is the channel's stored-readings
     * counter (kept exact in the ingestion transaction, one row by key), the time one index seek.
     */
    async extent(channelId: number): Promise<{ count: number; firstTs: number | null }> {
      const [[countRow], [firstRow]] = await Promise.all([
        arrays('SELECT stored_readings FROM channels WHERE tenant_id = :lab AND id = ?', [channelId]),
        arrays('SELECT MIN(ts) FROM readings WHERE tenant_id = :lab AND channel_id = ?', [channelId]),
      ]);
      return { count: Number(countRow?.[0] ?? 0), firstTs: firstRow[0] === null ? null : Number(firstRow[0]) };
    },
  };
}

export type ChannelReadingsRepo = ReturnType<typeof channelReadingsRepo>;
