import { z } from 'zod';
import { parseReadingTime } from '../services/ingest/parse-reading-time.ts';
import type { IsoTime } from './common.ts';
import type { Channel } from './loggers.ts';
import { RANGE_REASONS } from './words/channels.ts';
import { atLeast, atMost } from './words/reasons.ts';

/**
 * The channel browser: the inputs of the overview, detail, chart series and readings export,
 * and their answers. Times in a query are epoch milliseconds or ISO 8601 with a zone (Z or
 * ±hh:mm); times in an answer are epoch milliseconds and, where named `time`, ISO 8601 UTC.
 * Pure zod plus the reading-time parser of ingestion, so the client may import it.
 */

/** Longest range a request may ask for (20 years of 365.25 days). */
export const MAX_RANGE_MS = 20 * 365.25 * 86_400_000;
/** Default range when from/to are left out: the 7 days up to now (to rounded up to the minute). */
export const DEFAULT_RANGE_MS = 7 * 86_400_000;

const ZONED_ISO = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:\d{2})$/;
const TIME_MESSAGE = RANGE_REASONS.time;

/** A time in a query: epoch milliseconds or ISO 8601 with a zone, parsed to epoch milliseconds. */
export const timeParam = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (!/^-?\d{1,16}$/.test(s) && !ZONED_ISO.test(s)) {
      ctx.addIssue({ code: 'custom', message: TIME_MESSAGE });
      return z.NEVER;
    }
    // the calendar and offset checks of ingestion (no 30 February, offsets −12:00…+14:00)
    const parsed = parseReadingTime(s);
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', message: parsed.reason.replace(/^ts: /, '') });
      return z.NEVER;
    }
    return parsed.ts;
  });

/** A whole number from a query string within [min, max], with `field: reason` messages. */
export const wholeNumber = (min: number, max: number) =>
  z.coerce
    .number({ error: 'must be a number' })
    .int('must be a whole number')
    .min(min, atLeast(min))
    // an id's bound is no figure for people
    .max(max, max >= 1e9 ? 'is not one Lagbook knows' : atMost(max));

/** The optional `from` and `to` of a range query. */
export const rangeFields = { from: timeParam.optional(), to: timeParam.optional() };

/**
 * Fills the default range (the 7 days up to now, `to` rounded up to the minute) and checks
 * from < to and the 20-year limit; used as a zod transform by every range query.
 */
export function resolveRange<T extends { from?: number; to?: number }>(q: T, ctx: z.RefinementCtx, now: () => number): Omit<T, 'from' | 'to'> & TimeRange {
  const to = q.to ?? Math.ceil(now() / 60_000) * 60_000;
  const from = q.from ?? to - DEFAULT_RANGE_MS;
  if (!(from < to)) ctx.addIssue({ code: 'custom', path: ['to'], message: RANGE_REASONS.toAfterFrom });
  else if (to - from > MAX_RANGE_MS) ctx.addIssue({ code: 'custom', path: ['to'], message: RANGE_REASONS.rangeMax });
  return { ...q, from, to };
}

/** `/channels/:channelId`. */
export const channelParams = z.object({ channelId: wholeNumber(1, Number.MAX_SAFE_INTEGER) });
export type ChannelParams = z.infer<typeof channelParams>;

/** `GET …/channels/:channelId/series?from&to&points`. */
export const seriesQuery = (now: () => number = Date.now) =>
  z.object({ ...rangeFields, points: wholeNumber(10, 10_000).default(2000) }).transform((q, ctx) => resolveRange(q, ctx, now));
export type SeriesQuery = z.infer<ReturnType<typeof seriesQuery>>;

/** `GET …/channels/:channelId/readings.csv?from&to`. */
export const readingsExportQuery = (now: () => number = Date.now) => z.object(rangeFields).transform((q, ctx) => resolveRange(q, ctx, now));
export type ReadingsExportQuery = z.infer<ReturnType<typeof readingsExportQuery>>;

/** A time range in epoch ms, `from` inclusive, `to` exclusive. */
export interface TimeRange {
  from: number;
  to: number;
}

/**
 * The status shown beside a channel: `no-data` before its first reading, `silent` after 3
 * expected intervals without one, `out-of-range` when the last value lies outside the valid
 * range, else `live`.
 */
export type ChannelStatus = 'live' | 'silent' | 'out-of-range' | 'no-data';

/** The logger a channel belongs to, as the channel answers carry it. */
export interface ChannelLogger {
  id: number;
  name: string;
  site: string | null;
  timezone: string;
  expectedIntervalS: number;
}

/** A channel (as the logger pages show it) with its logger, status and latest reading. */
export interface ChannelState extends Channel {
  logger: ChannelLogger;
  status: ChannelStatus;
  /** Seconds between readings the status is judged by (the channel's, else its logger's). */
  statusIntervalS: number;
  /** Null until both the time and the value of a reading are known. */
  lastReading: { ts: number; time: IsoTime; value: number } | null;
  /** Grows whenever readings of the channel are stored (cache keys use it). */
  dataVersion: number;
}

/** One row of the overview: the channel plus 24 hourly means (null = no reading that hour). */
export interface ChannelOverviewRow extends ChannelState {
  sparkline: { startHour: number; stepS: number; means: Array<number | null> };
}

/** `GET …/channels`: every channel that is not retired, with `now` (epoch ms) as the server saw it. */
export interface ChannelsAnswer {
  channels: ChannelOverviewRow[];
  now: number;
}

/** One channel with the extent of its readings (`readingCount` from the channel's stored-readings counter, kept in the batch transaction). */
export interface ChannelDetail extends ChannelState {
  firstReading: { ts: number; time: IsoTime } | null;
  readingCount: number;
}

/** `GET …/channels/:channelId`. */
export interface ChannelDetailAnswer {
  channel: ChannelDetail;
}

/** Raw readings; a `null` value is a gap marker (draw the line broken there). */
export interface ReadingsSeries {
  shape: 'readings';
  source: 'raw';
  resolutionS: null;
  bucketMs: null;
  from: number;
  to: number;
  t: number[];
  value: Array<number | null>;
}

/** Min/max/mean/count per bucket (a bucket without readings has nulls and count 0). */
export interface BucketSeries {
  shape: 'buckets';
  source: 'rollup' | 'raw';
  /** The rollup resolution the buckets were summed from; null when read from raw readings. */
  resolutionS: number | null;
  bucketMs: number;
  /** The buckets' own extent (aligned to whole bucket widths, so it may reach past the request). */
  from: number;
  to: number;
  t: number[];
  min: Array<number | null>;
  max: Array<number | null>;
  mean: Array<number | null>;
  count: number[];
}

/** A channel's readings for a chart. */
export type Series = ReadingsSeries | BucketSeries;

/** `GET …/channels/:channelId/series`. */
export interface SeriesAnswer {
  channelId: number;
  /** The range and point count asked for, defaults filled in. */
  requested: TimeRange & { points: number };
  /** Epoch ms where the lab's plan history cut the range's start (older readings are kept), or null. */
  historyStartsAt: number | null;
  series: Series;
}
