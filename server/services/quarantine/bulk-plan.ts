import type { BulkAction, BulkReasonGroup } from '../../contract/quarantine.ts';
import type { QuarantinedRow } from '../../db/quarantine.repo.ts';
import { readRowTime, type IncomingReading } from '../ingest/check-rows.ts';
import { timeReadingOf } from '../ingest/import-upload.ts';
import type { TimeFormat } from '../ingest/parse-reading-time.ts';
import type { TimeLayout } from '../ingest/time-layouts.ts';
import { QUARANTINE_LABELS } from '../../contract/words/quarantine.ts';
import { fieldRefusal } from '../service-errors.ts';

/** What a bulk repair needs to know of a selected row's logger. */
export interface BulkLogger {
  id: number;
  name: string;
  timezone: string;
}

/** What a bulk repair needs to know of the channel a `map-channel` names. */
export interface BulkChannel {
  id: number;
  loggerId: number;
  key: string;
  retiredAt: Date | null;
}

/** How one logger's rows are read again: the batch options of ingestion. */
export interface BulkReading {
  timeFormat: TimeFormat;
  timeLayout?: TimeLayout;
  timeZone: string;
  timeShiftMs?: number;
}

/** A checked repair: discard, or send the rows through ingestion with these readings. */
export type BulkPlan =
  { kind: 'discard'; reason: string } | { kind: 'ingest'; readingFor: (logger: BulkLogger) => BulkReading; channelOf: (row: QuarantinedRow) => string | null };

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/**
 * Checks a bulk repair against the rows it would reach and turns it into a plan, or refuses it
 * with a 400 naming the field and the fix before anything is changed: an empty selection, rows
 * of no logger for anything but discard, an unreadable custom pattern (`timePattern`), a shift
 * that would move a row past `now` (`offsetMinutes`), a channel that is retired or belongs to
 * another logger than some selected rows (`channelId`). Pure: the caller loads the rows, their
 * loggers and the named channel.
 */
export function planBulk(
  action: BulkAction,
  rows: readonly QuarantinedRow[],
  loggers: ReadonlyMap<number, BulkLogger>,
  channel: BulkChannel | null,
  now: number,
): BulkPlan {
  if (rows.length === 0) throw fieldRefusal('selection', QUARANTINE_LABELS.selection, 'no quarantined rows match; change the filters or choose rows');
  if (action.kind === 'discard') return { kind: 'discard', reason: action.reason };
  const orphans = rows.filter((r) => r.loggerId === null || !loggers.has(r.loggerId)).length;
  if (orphans)
    throw fieldRefusal(
      'selection',
      QUARANTINE_LABELS.selection,
      `${plural(orphans, 'row')} ${orphans === 1 ? 'belongs' : 'belong'} to no logger and can only be discarded; narrow the selection by logger`,
    );
  const keep = (r: QuarantinedRow) => r.channelKey;
  switch (action.kind) {
    case 'reread': {
      const reading = timeReadingOf(action.timeFormat, action.timePattern);
      return { kind: 'ingest', channelOf: keep, readingFor: (l) => ({ ...reading, timeZone: action.timeZone ?? l.timezone }) };
    }
    case 'shift': {
      const shift = action.offsetMinutes * 60_000;
      const readingFor = (l: BulkLogger): BulkReading => ({ timeFormat: 'auto', timeZone: l.timezone, timeShiftMs: shift });
      let future = 0;
      let latest = -Infinity;
      for (const r of rows) {
        const t = readRowTime(r.tsRaw, readingFor(loggers.get(r.loggerId!)!));
        if (t.ok && t.ts > now) {
          future++;
          latest = Math.max(latest, t.ts);
        }
      }
      if (future) {
        throw fieldRefusal(
          'offsetMinutes',
          QUARANTINE_LABELS.offsetMinutes,
          `would move ${plural(future, 'row')} into the future (the latest by ${durationAhead(latest - now)}); use a smaller shift or narrow the selection`,
        );
      }
      return { kind: 'ingest', channelOf: keep, readingFor };
    }
    case 'map-channel': {
      if (!channel) throw fieldRefusal('channelId', QUARANTINE_LABELS.channelId, "is not a channel of this lab; choose one of the logger's channels");
      if (channel.retiredAt)
        throw fieldRefusal('channelId', QUARANTINE_LABELS.channelId, `"${channel.key}" is retired; choose a channel of the logger that is in use`);
      const elsewhere = rows.filter((r) => r.loggerId !== channel.loggerId).length;
      if (elsewhere) {
        const owner = loggers.get(channel.loggerId)?.name;
        throw fieldRefusal(
          'channelId',
          QUARANTINE_LABELS.channelId,
          `"${channel.key}" belongs to ${owner ? `logger "${owner}"` : 'another logger'}, but ${plural(elsewhere, 'selected row comes', 'selected rows come')} from another logger; filter the selection by that logger first`,
        );
      }
      return { kind: 'ingest', channelOf: () => channel.key, readingFor: (l) => ({ timeFormat: 'auto', timeZone: l.timezone }) };
    }
  }
}

/**
 * A quarantined row as ingestion takes it again: the (new) channel, the time and value texts as
 * kept, and the row's text as first received (so a row that stays in quarantine keeps it).
 * `index` is its position in its batch.
 */
export function incomingOf(row: QuarantinedRow, channel: string | null, index: number): IncomingReading {
  return { index, channel: channel ?? undefined, ts: row.tsRaw ?? undefined, value: row.valueRaw ?? undefined, raw: row.raw ?? undefined };
}

/** Rows that stay quarantined, grouped by their new reason code, biggest group first (one reason text as example). */
export function groupReasons(entries: ReadonlyArray<{ code: string; reason: string }>): BulkReasonGroup[] {
  const groups = new Map<string, BulkReasonGroup>();
  for (const e of entries) {
    const g = groups.get(e.code);
    if (g) g.count++;
    else groups.set(e.code, { code: e.code, count: 1, example: e.reason });
  }
  return [...groups.values()].sort((a, b) => b.count - a.count || a.code.localeCompare(b.code));
}

/** How far ahead of now an instant lies, in words ("3 hours", "2 days"), for a refused shift. */
function durationAhead(ms: number): string {
  const minutes = Math.max(1, Math.ceil(ms / 60_000));
  if (minutes < 120) return plural(minutes, 'minute');
  const hours = Math.ceil(minutes / 60);
  return hours < 48 ? plural(hours, 'hour') : plural(Math.ceil(hours / 24), 'day');
}
