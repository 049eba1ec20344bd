import type { LabScope } from './tenant-scope.ts';
import { finestRollupSql } from './rollup-levels.ts';

/** Rollup rows removed per statement when a level goes: bounded, so no statement grows large. */
export const ROLLUP_DELETE_BATCH = 10_000;

/** The interval a channel reports at: its own, else its logger's (channels `c`, loggers `l`). */
const INTERVAL = 'COALESCE(c.expected_interval_s, l.expected_interval_s)';
const WANTED = finestRollupSql(INTERVAL);
const CHANNELS_WITH_LOGGER = 'channels c JOIN loggers l ON l.tenant_id = c.tenant_id AND l.id = c.logger_id';

/** A channel's finest kept rollup level as stored (`floor`) and as its interval calls for (`wanted`). */
export interface ChannelLevels {
  channelId: number;
  floor: number | null;
  wanted: number | null;
}

const orNull = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/**
 * Data access for changing which rollup levels a lab's channels keep (see rollup-levels.ts and
 * services/rollup-levels.service.ts): the stored floor against the one the interval calls for,
 * raising a floor, removing a level's rows in bounded batches, building a level from raw
 * readings one range at a time.
 */
export function rollupLevelsRepo(scope: LabScope) {
  return {
    /** The stored and wanted floors of these channels, of one logger's channels, or of every channel of the lab. */
    async levels(of: { channelIds: number[] } | { loggerId: number } | { wholeLab: true }): Promise<ChannelLevels[]> {
      if ('channelIds' in of && of.channelIds.length === 0) return [];
      const [where, bindings]: [string, unknown[]] =
        'channelIds' in of
          ? [`c.id IN (${of.channelIds.map(() => '?').join(', ')})`, of.channelIds]
          : 'loggerId' in of
            ? ['c.logger_id = ?', [of.loggerId]]
            : ['1 = 1', []];
      const rows = await scope.arrays(`SELECT c.id, c.finest_rollup_s, ${WANTED} FROM ${CHANNELS_WITH_LOGGER} WHERE c.tenant_id = :lab AND ${where}`, bindings);
      return rows.map((r) => ({ channelId: Number(r[0]), floor: orNull(r[1]), wanted: orNull(r[2]) }));
    },

    /**
     * Raises the stored floor to the wanted one wherever the interval now calls for fewer levels
     * (readers stop using the finer levels as this commits). Lowering a floor is never done
     * here: the finer level must be built first. Returns the channels raised.
     */
    async raiseFloors(of: { channelIds: number[] } | { loggerId: number }): Promise<number> {
      if ('channelIds' in of && of.channelIds.length === 0) return 0;
      const [where, bindings] =
        'channelIds' in of ? [`c.id IN (${of.channelIds.map(() => '?').join(', ')})`, of.channelIds] : ['c.logger_id = ?', [of.loggerId]];
      const [result] = await scope.raw(
        `UPDATE ${CHANNELS_WITH_LOGGER} SET c.finest_rollup_s = ${WANTED}
         WHERE c.tenant_id = :lab AND ${where} AND c.finest_rollup_s IS NOT NULL AND (${WANTED} IS NULL OR ${WANTED} > c.finest_rollup_s)`,
        bindings,
      );
      return Number((result as { affectedRows: number }).affectedRows);
    },

    /**
     * Sets the channel's floor to `floor` if it still is `expected` and its interval still calls
     * for `floor` (an edit in between wins). Returns whether it was set.
     */
    async lowerFloor(channelId: number, floor: number, expected: number | null): Promise<boolean> {
      const [result] = await scope.raw(
        `UPDATE ${CHANNELS_WITH_LOGGER} SET c.finest_rollup_s = ?
         WHERE c.tenant_id = :lab AND c.id = ? AND c.finest_rollup_s <=> ? AND ${WANTED} <=> ?`,
        [floor, channelId, expected, floor],
      );
      return Number((result as { affectedRows: number }).affectedRows) === 1;
    },

    /** Whether the channel has rollup rows of levels below `floor` (null: any level). One key seek. */
    async hasRowsBelow(channelId: number, floor: number | null): Promise<boolean> {
      const rows = await scope.arrays('SELECT 1 FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s < ? LIMIT 1', [
        channelId,
        floor ?? Number.MAX_SAFE_INTEGER,
      ]);
      return rows.length > 0;
    },

    /**
     * Deletes the channel's rollup rows of levels below `floor` (null: every level), at most
     * `batch` rows a statement along the primary key, each statement its own commit. Returns the
     * rows removed.
     */
    async deleteBelow(channelId: number, floor: number | null, batch = ROLLUP_DELETE_BATCH): Promise<number> {
      let removed = 0;
      for (;;) {
        const [result] = await scope.raw(
          'DELETE FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s < ? ORDER BY resolution_s, bucket_start LIMIT ?',
          [channelId, floor ?? Number.MAX_SAFE_INTEGER, batch],
        );
        const n = Number((result as { affectedRows: number }).affectedRows);
        removed += n;
        if (n < batch) return removed;
      }
    },

    /** The times of the channel's first and last reading (two index seeks), null without readings. */
    async readingSpan(channelId: number): Promise<{ first: number; last: number } | null> {
      const [row] = await scope.arrays('SELECT MIN(ts), MAX(ts) FROM readings WHERE tenant_id = :lab AND channel_id = ?', [channelId]);
      return row[0] === null ? null : { first: Number(row[0]), last: Number(row[1]) };
    },

    /**
     * (Re)computes the channel's rollups of `resolutionS` for buckets starting in [from, to) from
     * its raw readings (`from` and `to` on bucket boundaries), replacing what is stored there.
     */
    async buildFromRaw(channelId: number, resolutionS: number, from: number, to: number): Promise<void> {
      const ms = resolutionS * 1000;
      await scope.raw(
        `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
         SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
         FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts >= ? AND ts < ?
         GROUP BY channel_id, b
         ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value),
           sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
        [resolutionS, ms, channelId, from, to],
      );
    },
  };
}

export type RollupLevelsRepo = ReturnType<typeof rollupLevelsRepo>;
