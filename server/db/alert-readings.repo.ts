import type { LabScope } from './tenant-scope.ts';

/** What a rule watches, as the evaluator and the mail need it. */
export interface WatchedTarget {
  /** The channel (null for a rule on a whole logger). */
  channelId: number | null;
  loggerId: number;
  label: string;
  loggerName: string;
  unit: string;
  /** The channel's expected interval, else its logger's (seconds). */
  expectedIntervalS: number;
  /** Newest reading time of the channel, or of any live channel of the logger; null if none. */
  lastReadingTs: number | null;
  timezone: string;
}

const opt = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/**
 * The few reads the alert evaluator needs beyond the readings themselves (those come through
 * channel-readings.repo.ts): the watched channel or logger with its newest reading time,
 * kept current by ingestion on the channel row, so silence checks never scan readings.
 */
export function alertReadingsRepo(scope: LabScope) {
  return {
    async channelTarget(channelId: number): Promise<WatchedTarget | null> {
      const r = await scope
        .table('channels')
        .join('loggers', function joinLogger() {
          this.on('loggers.tenant_id', 'channels.tenant_id').andOn('loggers.id', 'channels.logger_id');
        })
        .where('channels.id', channelId)
        .first(
          'channels.id as channelId',
          'channels.logger_id as loggerId',
          'channels.label',
          'channels.unit',
          'channels.expected_interval_s as channelInterval',
          'loggers.expected_interval_s as loggerInterval',
          'loggers.name as loggerName',
          'loggers.timezone',
          'channels.last_reading_ts as lastReadingTs',
        );
      if (!r) return null;
      return {
        channelId: Number(r.channelId),
        loggerId: Number(r.loggerId),
        label: r.label,
        loggerName: r.loggerName,
        unit: r.unit ?? '',
        expectedIntervalS: Number(r.channelInterval ?? r.loggerInterval),
        lastReadingTs: opt(r.lastReadingTs),
        timezone: r.timezone,
      };
    },
    async loggerTarget(loggerId: number): Promise<WatchedTarget | null> {
      const logger = await scope
        .table('loggers')
        .where('loggers.id', loggerId)
        .first('loggers.id', 'loggers.name', 'loggers.expected_interval_s as interval', 'loggers.timezone');
      if (!logger) return null;
      const last = await scope
        .table('channels')
        .where('channels.logger_id', loggerId)
        .whereNull('channels.retired_at')
        .max('channels.last_reading_ts as ts')
        .first();
      return {
        channelId: null,
        loggerId: Number(logger.id),
        label: `every channel of ${logger.name}`,
        loggerName: logger.name,
        unit: '',
        expectedIntervalS: Number(logger.interval),
        lastReadingTs: opt(last?.ts),
        timezone: logger.timezone,
      };
    },
  };
}

export type AlertReadingsRepo = ReturnType<typeof alertReadingsRepo>;
