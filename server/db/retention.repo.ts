import type { DbOrTrx, LabScope } from './tenant-scope.ts';
import { BEFORE_PARTITION, FUTURE_PARTITION, parseMonthPartitionName } from './reading-partitions.ts';

/** One retention run as recorded in `retention_runs` (outside any lab). */
export interface RetentionRun {
  id: number;
  holder: string;
  startedAt: Date;
  finishedAt: Date | null;
  readingsRemoved: number;
  partitionsDropped: number;
  lastError: string | null;
}

/** Rows of one lab's channel in a partition about to be dropped. */
export interface ChannelRows {
  tenantId: number;
  channelId: number;
  rows: number;
}

/** A journaled partition drop (`retention_partition_drops`) not yet settled or cancelled. */
export interface OpenPartitionDrop {
  id: number;
  runId: number;
  partitionName: string;
  monthEnd: number;
  channelRows: ChannelRows[];
  readings: number;
}

const toRun = (r: Record<string, unknown>): RetentionRun => ({
  id: Number(r.id),
  holder: r.holder as string,
  startedAt: r.started_at as Date,
  finishedAt: (r.finished_at as Date | null) ?? null,
  readingsRemoved: Number(r.readings_removed),
  partitionsDropped: Number(r.partitions_dropped),
  lastError: (r.last_error as string | null) ?? null,
});

/** A partition name this module may put into SQL: one of the partition primitives' names only. */
function checkedPartitionName(name: string): string {
  if (name !== BEFORE_PARTITION && name !== FUTURE_PARTITION && parseMonthPartitionName(name) === null) {
    throw new Error(`retention: not a partition name of readings: ${name}`);
  }
  return name;
}

/**
 * Data access for the retention job's own records, kept outside any lab: the runs
 * (`retention_runs`) and the journal of partition drops (`retention_partition_drops`), plus the
 * one cross-lab read the job needs — which labs hold readings in a partition.
 */
export function retentionRecordsRepo(db: DbOrTrx) {
  return {
    /** Records a run just started; returns its id. */
    async startRun(holder: string, at: Date): Promise<number> {
      const [id] = await db('retention_runs').insert({ holder, started_at: at });
      return Number(id);
    },

    /** Records how a run ended. */
    async finishRun(id: number, at: Date, outcome: { readingsRemoved: number; partitionsDropped: number; lastError: string | null }): Promise<void> {
      await db('retention_runs')
        .where({ id })
        .update({
          finished_at: at,
          readings_removed: outcome.readingsRemoved,
          partitions_dropped: outcome.partitionsDropped,
          last_error: outcome.lastError === null ? null : outcome.lastError.slice(0, 2000),
        });
    },

    /** The latest run started (finished or not), or null before the first. */
    async latestRun(): Promise<RetentionRun | null> {
      const row = await db('retention_runs').orderBy('id', 'desc').first();
      return row ? toRun(row) : null;
    },

    /** Writes the journal row of a partition drop before anything is dropped; returns its id. */
    async journalDrop(runId: number, partitionName: string, monthEnd: number, channelRows: ChannelRows[], at: Date): Promise<number> {
      const readings = channelRows.reduce((sum, c) => sum + c.rows, 0);
      const [id] = await db('retention_partition_drops').insert({
        run_id: runId,
        partition_name: checkedPartitionName(partitionName),
        month_end: monthEnd,
        channel_rows: JSON.stringify(channelRows.map((c) => [c.tenantId, c.channelId, c.rows])),
        readings,
        journaled_at: at,
      });
      return Number(id);
    },

    /** Journaled drops neither settled nor cancelled (a run died between the journal and the counters), oldest first. */
    async openDrops(): Promise<OpenPartitionDrop[]> {
      const rows = await db('retention_partition_drops').whereNull('settled_at').whereNull('cancelled_at').orderBy('id');
      return rows.map((r: Record<string, unknown>) => ({
        id: Number(r.id),
        runId: Number(r.run_id),
        partitionName: r.partition_name as string,
        monthEnd: Number(r.month_end),
        readings: Number(r.readings),
        channelRows: (JSON.parse(String(r.channel_rows)) as Array<[number, number, number]>).map(([tenantId, channelId, rows]) => ({
          tenantId,
          channelId,
          rows,
        })),
      }));
    },

    /** Marks a drop settled (its counters lowered) — call inside the transaction that lowers them. */
    async settleDrop(id: number, at: Date): Promise<boolean> {
      return (await db('retention_partition_drops').where({ id }).whereNull('settled_at').whereNull('cancelled_at').update({ settled_at: at })) > 0;
    },

    /** Marks a drop given up (the partition is still there and may no longer go); nothing was lowered. */
    async cancelDrop(id: number, at: Date): Promise<void> {
      await db('retention_partition_drops').where({ id }).whereNull('settled_at').update({ cancelled_at: at });
    },

    /**
     * The labs holding rows in one partition of `readings` or `reading_rollups`: MariaDB answers it
     * by a loose index scan of the primary key's first column (EXPLAIN: "Using index for group-by"),
     * one step per lab instead of a read of the partition's rows.
     */
    async labsInPartition(table: 'readings' | 'reading_rollups', partitionName: string): Promise<number[]> {
      const [rows] = (await db.raw(`SELECT DISTINCT tenant_id AS t FROM ?? PARTITION (${checkedPartitionName(partitionName)})`, [table])) as unknown as [
        Array<{ t: number | string }>,
      ];
      return rows.map((r) => Number(r.t)).sort((a, b) => a - b);
    },
  };
}

export type RetentionRecordsRepo = ReturnType<typeof retentionRecordsRepo>;

/**
 * One lab's side of retention, on a lab scope (its connection or transaction): the channels,
 * bounded deletes of readings and rollups before a horizon, and the stored-readings counters
 * lowered with them. Every statement is keyed on (lab, channel[, resolution]) and a time bound.
 */
export function retentionLabRepo(scope: LabScope) {
  const affected = (result: unknown): number => Number((result as [{ affectedRows?: number }])[0]?.affectedRows ?? 0);
  return {
    /** Every channel of the lab that has ever stored a reading or rollup (retired ones included). */
    async channelIds(): Promise<number[]> {
      return (await scope.table('channels').orderBy('channels.id').select('channels.id')).map((r: { id: number | string }) => Number(r.id));
    },

    /** Deletes up to `limit` of the channel's oldest readings before `beforeMs`; returns how many went. */
    async deleteReadingsBefore(channelId: number, beforeMs: number, limit: number): Promise<number> {
      return affected(
        await scope.raw('DELETE FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts < ? ORDER BY tenant_id, channel_id, ts LIMIT ?', [
          channelId,
          beforeMs,
          limit,
        ]),
      );
    },

    /**
     * The rollup resolutions (seconds) the channel has rows at, ascending: one index dive per
     * resolution (the next resolution above the last found), never a read of the rollup rows.
     */
    async rollupResolutions(channelId: number): Promise<number[]> {
      const found: number[] = [];
      for (let above = -1; ;) {
        const [rows] = (await scope.raw('SELECT MIN(resolution_s) AS r FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s > ?', [
          channelId,
          above,
        ])) as unknown as [Array<{ r: number | string | null }>];
        const r = rows[0]?.r;
        if (r === null || r === undefined) return found;
        above = Number(r);
        found.push(above);
      }
    },

    /**
     * Deletes up to `limit` of the channel's rollup rows at one resolution whose whole bucket
     * ends at or before `beforeMs` (a bucket straddling it is never touched); returns how many went.
     */
    async deleteRollupsBefore(channelId: number, resolutionS: number, beforeMs: number, limit: number): Promise<number> {
      return affected(
        await scope.raw(
          `DELETE FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s = ? AND bucket_start <= ?
           ORDER BY tenant_id, channel_id, resolution_s, bucket_start LIMIT ?`,
          [channelId, resolutionS, beforeMs - resolutionS * 1000, limit],
        ),
      );
    },

    /**
     * Lowers a channel's stored-readings counter by `n` readings removed (never below 0) and
     * moves its data version on, so no cached answer outlives the readings it was made from.
     */
    async lowerChannelCount(channelId: number, n: number): Promise<void> {
      if (n <= 0) return;
      await scope.raw(
        'UPDATE channels SET stored_readings = stored_readings - LEAST(stored_readings, ?), data_version = data_version + 1 WHERE tenant_id = :lab AND id = ?',
        [n, channelId],
      );
    },

    /** Lowers the lab's billing counter of stored readings by `n` (never below 0); a lab without a billing row has nothing to lower. */
    async lowerLabCount(n: number): Promise<void> {
      if (n <= 0) return;
      await scope.raw('UPDATE lab_billing SET readings_count = readings_count - LEAST(readings_count, ?) WHERE tenant_id = :lab', [n]);
    },

    /**
     * The time (epoch ms) of a channel's oldest stored reading, or null: the first key of the
     * channel in the primary key (one index dive, whatever the channel holds).
     */
    async oldestReading(channelId: number): Promise<number | null> {
      const [rows] = (await scope.raw('SELECT MIN(ts) AS t FROM readings WHERE tenant_id = :lab AND channel_id = ?', [channelId])) as unknown as [
        Array<{ t: number | string | null }>,
      ];
      const t = rows[0]?.t;
      return t === null || t === undefined ? null : Number(t);
    },

    /**
     * Readings of one channel before `beforeMs` (a UTC day start): the sum of its day rollups
     * before it (keyed, one row per day) when it has them; a count of raw readings otherwise
     * (a channel that reports daily or slower keeps no day level and has few readings).
     */
    async readingsBefore(channelId: number, beforeMs: number): Promise<number> {
      const [days] = (await scope.raw(
        'SELECT COUNT(*) AS buckets, COALESCE(SUM(count_value), 0) AS n FROM reading_rollups WHERE tenant_id = :lab AND channel_id = ? AND resolution_s = 86400 AND bucket_start < ?',
        [channelId, beforeMs],
      )) as unknown as [Array<{ buckets: number | string; n: number | string }>];
      if (Number(days[0]?.buckets ?? 0) > 0) return Number(days[0].n);
      const [raw] = (await scope.raw('SELECT COUNT(*) AS n FROM readings WHERE tenant_id = :lab AND channel_id = ? AND ts < ?', [
        channelId,
        beforeMs,
      ])) as unknown as [Array<{ n: number | string }>];
      return Number(raw[0]?.n ?? 0);
    },
  };
}

export type RetentionLabRepo = ReturnType<typeof retentionLabRepo>;
