import type { LabScope } from './tenant-scope.ts';
import { CHANNEL_COLUMNS, toChannel, type Channel } from './channels.repo.ts';

/** A channel with its logger and the state ingestion keeps current. */
export interface ChannelWithState extends Channel {
  lastReadingTs: number | null;
  lastReadingValue: number | null;
  dataVersion: number;
  logger: {
    id: number;
    name: string;
    site: string | null;
    timezone: string;
    expectedIntervalS: number;
    retiredAt: Date | null;
  };
}

const COLUMNS = [
  ...CHANNEL_COLUMNS,
  'channels.last_reading_ts as lastReadingTs',
  'channels.last_reading_value as lastReadingValue',
  'channels.data_version as dataVersion',
  'loggers.name as loggerName',
  'loggers.site as loggerSite',
  'loggers.timezone as loggerTimezone',
  'loggers.expected_interval_s as loggerExpectedIntervalS',
  'loggers.retired_at as loggerRetiredAt',
];

const toChannelWithState = (r: Record<string, unknown>): ChannelWithState => ({
  ...toChannel(r),
  lastReadingTs: r.lastReadingTs === null ? null : Number(r.lastReadingTs),
  lastReadingValue: r.lastReadingValue === null ? null : Number(r.lastReadingValue),
  dataVersion: Number(r.dataVersion),
  logger: {
    id: Number(r.loggerId),
    name: r.loggerName as string,
    site: (r.loggerSite as string | null) ?? null,
    timezone: r.loggerTimezone as string,
    expectedIntervalS: Number(r.loggerExpectedIntervalS),
    retiredAt: (r.loggerRetiredAt as Date | null) ?? null,
  },
});

/** Channels joined with their logger, both limited to this lab. */
function withLogger(scope: LabScope) {
  return scope
    .table('channels')
    .join('loggers', (j) => j.on('loggers.tenant_id', '=', 'channels.tenant_id').andOn('loggers.id', '=', 'channels.logger_id'))
    .select(COLUMNS);
}

/**
 * Data access for the per-channel state that ingestion keeps (latest reading, data version),
 * read together with the channel's logger.
 */
export function channelStateRepo(scope: LabScope) {
  return {
    /** Every channel in use: neither it nor its logger retired; by logger name, then label. */
    async listActive(): Promise<ChannelWithState[]> {
      const rows = await withLogger(scope)
        .whereNull('channels.retired_at')
        .whereNull('loggers.retired_at')
        .orderBy([{ column: 'loggers.name' }, { column: 'channels.label' }, { column: 'channels.id' }]);
      return rows.map(toChannelWithState);
    },

    /** One channel of this lab (retired ones included: their history stays readable). */
    async find(channelId: number): Promise<ChannelWithState | null> {
      const row = await withLogger(scope).where('channels.id', channelId).first();
      return row ? toChannelWithState(row) : null;
    },

    /**
     * After a batch stored new readings: for each channel, `ts` names the latest time the batch
     * carried for it (stored now or before) and `added` how many readings the batch newly stored
     * for it. The channel's last reading moves to `ts` unless it already is later, the value is
     * taken from the stored reading (a conflicting newcomer never replaced it), the data version
     * goes up by one and `stored_readings` by `added` — one statement for the whole batch, in
     * the batch's transaction, so the counter is exactly the channel's row count whenever the
     * batch commits. The channels are named by id as well, so the statement reads only the
     * batch's channel rows whichever join order the optimizer picks. The readings row is LEFT-joined: should the latest reading be missing (it
     * cannot be, short of a concurrent delete), the counter and version still move and the last
     * reading stays. The SET expressions give the same result in either evaluation order
     * (r.ts ≥ GREATEST(old, r.ts) exactly when r.ts ≥ old), which matters because MariaDB does
     * not promise an order for multi-table UPDATEs.
     */
    async advance(latest: Array<{ channelId: number; ts: number; added?: number }>): Promise<void> {
      if (latest.length === 0) return;
      const batch = latest.map((_, i) => (i === 0 ? 'SELECT ? AS id, ? AS ts, ? AS added' : 'SELECT ?, ?, ?')).join(' UNION ALL ');
      await scope.raw(
        `UPDATE channels c
         JOIN (${batch}) b ON b.id = c.id
         LEFT JOIN readings r ON r.tenant_id = c.tenant_id AND r.channel_id = b.id AND r.ts = b.ts
         SET c.last_reading_value = IF(r.ts IS NOT NULL AND (c.last_reading_ts IS NULL OR r.ts >= c.last_reading_ts), r.value, c.last_reading_value),
             c.last_reading_ts = IF(r.ts IS NULL, c.last_reading_ts, GREATEST(COALESCE(c.last_reading_ts, r.ts), r.ts)),
             c.data_version = c.data_version + 1,
             c.stored_readings = c.stored_readings + b.added
         WHERE c.tenant_id = :lab AND c.id IN (${latest.map(() => '?').join(', ')})`,
        [...latest.flatMap((l) => [l.channelId, l.ts, l.added ?? 0]), ...latest.map((l) => l.channelId)],
      );
    },

    /**
     * Moves each channel's stored-readings counter by `delta` (readings stored or deleted in the
     * caller's transaction outside `advance`: a batch some of whose rows were already stored,
     * or retention's deletes), never below zero. One statement; zero deltas are skipped.
     */
    async adjustStored(deltas: Array<{ channelId: number; delta: number }>): Promise<void> {
      const list = deltas.filter((d) => d.delta !== 0);
      if (list.length === 0) return;
      const cases = list.map(() => 'WHEN ? THEN ?').join(' ');
      await scope.raw(
        `UPDATE channels SET stored_readings = GREATEST(CAST(stored_readings AS SIGNED) + CASE id ${cases} ELSE 0 END, 0)
         WHERE tenant_id = :lab AND id IN (${list.map(() => '?').join(', ')})`,
        [...list.flatMap((d) => [d.channelId, d.delta]), ...list.map((d) => d.channelId)],
      );
    },
  };
}

export type ChannelStateRepo = ReturnType<typeof channelStateRepo>;
