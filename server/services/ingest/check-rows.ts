import { BatchCandidates } from './batch-candidates.ts';
import { parseReadingValue } from './parse-reading-value.ts';
import { parseReadingTime, type TimeFormat, type TimeParse } from './parse-reading-time.ts';
import { parseWithLayout, type TimeLayout } from './time-layouts.ts';

/** One row as it arrived, before anything is checked. `index` is its position in the request. */
export interface IncomingReading {
  index: number;
  channel: unknown;
  ts: unknown;
  value: unknown;
  /**
   * The row as sent, kept in quarantine for review: a CSV line, or the JSON value itself, which
   * is rendered as text only if the row goes to quarantine (most rows never need it).
   */
  raw?: string | object;
}

/** A row that goes to quarantine: its stable reason code, the `field: reason` text and, if its time was read, that time (epoch ms). */
export interface RejectedRow {
  row: IncomingReading;
  code: string;
  reason: string;
  ts?: number;
}

/** What a logger's channel must tell the check: its id, and whether it is retired. */
export interface CheckedChannel {
  id: number;
  retiredAt: Date | null;
}

export interface RowCheckOptions {
  /** The clock reading (epoch ms) that "the future" is measured from. */
  now: number;
  timeFormat?: TimeFormat;
  /** A layout chosen for the batch's times (an upload's); read in `timeZone`, and `timeFormat` is then unused. */
  timeLayout?: TimeLayout;
  timeZone?: string;
  /**
   * Added to every time once read (epoch ms, signed): a quarantine repair for a logger clock
   * that ran off by a fixed amount. The range checks see the shifted time.
   */
  timeShiftMs?: number;
}

/** The verdict on a batch's rows, before anything is stored. */
export interface CheckedRows {
  /** The readable rows, the first value per (channel, time) of the batch. */
  candidates: BatchCandidates;
  /** Rows that repeat an earlier row of the batch with the same value. */
  duplicatesInBatch: number;
  /** Rows for quarantine, in the order they were found. */
  rejected: RejectedRow[];
}

/** Readings more than this far in the future are refused (a logger clock that is badly off). */
export const MAX_FUTURE_MS = 24 * 3600 * 1000;
/** Rows checked between two yields to the event loop, so a large batch does not hold other requests up. */
const ROWS_PER_TURN = 10_000;

/**
 * Reads one row's time the way a batch with these options reads it: with the chosen layout in
 * `timeZone` (UTC if none), else by ingestion's own rules (`parseReadingTime`), then shifted by
 * `timeShiftMs`. Exported so a quarantine repair can show the time a row will be stored at.
 */
export function readRowTime(ts: unknown, options: Omit<RowCheckOptions, 'now'>): TimeParse {
  const time = options.timeLayout
    ? parseWithLayout(String(ts ?? ''), options.timeLayout, options.timeZone ?? 'UTC')
    : parseReadingTime(ts, { format: options.timeFormat, timeZone: options.timeZone });
  return time.ok && options.timeShiftMs ? { ok: true, ts: time.ts + options.timeShiftMs } : time;
}

/**
 * Decides, without the database, what becomes of each row of a batch: a candidate for storage,
 * a duplicate of an earlier row of the same batch, or a row for quarantine with its reason
 * (missing, unknown or retired channel; unreadable or out-of-range time; unreadable value; a
 * second value for a channel and time the batch already has). `channels` maps the logger's
 * channel keys, retired ones included. Every row lands in exactly one of the three outcomes.
 *
 * Asynchronous only to yield to the event loop every 10,000 rows (a 100,000-row request would
 * otherwise hold the server for its whole check).
 */
export async function checkRows(
  rows: readonly IncomingReading[],
  channels: ReadonlyMap<string, CheckedChannel>,
  options: RowCheckOptions,
): Promise<CheckedRows> {
  const candidates = new BatchCandidates(rows.length);
  const rejected: RejectedRow[] = [];
  let duplicatesInBatch = 0;
  const latestAllowed = options.now + MAX_FUTURE_MS;
  const reject = (row: IncomingReading, code: string, reason: string, ts?: number) => {
    rejected.push({ row, code, reason, ts });
  };
  for (let at = 0; at < rows.length; at++) {
    if (at > 0 && at % ROWS_PER_TURN === 0) await new Promise<void>((resolve) => setImmediate(resolve));
    const row = rows[at];
    const key = typeof row.channel === 'string' ? row.channel.trim() : null;
    if (!key) {
      reject(row, 'missing_channel', 'channel: missing');
      continue;
    }
    const channel = channels.get(key);
    if (!channel) {
      reject(row, 'unknown_channel', `channel: no channel "${key.slice(0, 64)}" on this logger`);
      continue;
    }
    if (channel.retiredAt) {
      reject(row, 'retired_channel', `channel: "${key}" is retired`);
      continue;
    }
    const time = readRowTime(row.ts, options);
    if (!time.ok) {
      reject(row, time.code, time.reason);
      continue;
    }
    if (time.ts < 0 || time.ts > latestAllowed) {
      reject(row, 'time_out_of_range', time.ts < 0 ? 'ts: before 1970' : 'ts: more than 24 hours in the future (check the logger clock)', time.ts);
      continue;
    }
    const value = parseReadingValue(row.value);
    if (!value.ok) {
      reject(row, 'bad_value', value.reason, time.ts);
      continue;
    }
    const offer = candidates.offer(channel.id, time.ts, value.value, at);
    if (offer === 'duplicate') duplicatesInBatch++;
    else if (offer === 'conflict') reject(row, 'conflict_in_batch', 'ts: this batch has another value for the same channel and time', time.ts);
  }
  return { candidates, duplicatesInBatch, rejected };
}
