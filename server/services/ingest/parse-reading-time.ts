import { instantOfWallClock, naiveUtcMs as utcMs } from './wall-clock-instant.ts';

/**
 * Why a time could not be read: `bad_time` (not a time at all, or not a valid one) or
 * `time_out_of_range` (a number beyond what a JavaScript Date, and so the engine, can hold).
 */
export type TimeRefusal = 'bad_time' | 'time_out_of_range';

/** Result of reading one time field: epoch milliseconds, or why it could not be read. */
export type TimeParse = { ok: true; ts: number } | { ok: false; reason: string; code: TimeRefusal };

/**
 * The largest distance from the epoch a JavaScript Date can represent: ±8.64e15 ms
 * (±100,000,000 days, ECMA-262 §21.4.1.1 "Time Values and Time Range").
 */
export const MAX_TIME_MS = 8.64e15;

/** Real-world UTC offsets run from −12:00 (Baker Island) to +14:00 (Line Islands), IANA tz database. */
const MIN_OFFSET_MINUTES = -12 * 60;
const MAX_OFFSET_MINUTES = 14 * 60;

const ISO_WITH_OFFSET = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?(Z|[+-]\d{2}(?::?\d{2})?)$/i;
const ISO_LOCAL = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?$/;
const DIGITS = /^-?\d+$/;
const DECIMAL = /^-?\d+\.\d*$/;

const bad = (reason: string): TimeParse => ({ ok: false, reason, code: 'bad_time' });

/** A time in epoch ms if the engine can hold it, else a `time_out_of_range` refusal naming the text sent. */
function inRange(ts: number, sent: string): TimeParse {
  if (Math.abs(ts) > MAX_TIME_MS) {
    return {
      ok: false,
      code: 'time_out_of_range',
      reason: `ts: "${sent.slice(0, 40)}" is beyond the times that can be stored (±8.64e15 ms from 1970, about ±273,000 years)`,
    };
  }
  return { ok: true, ts };
}

/** Days in a month of the proleptic Gregorian calendar. */
function daysIn(year: number, month: number): number {
  return new Date(utcMs(year, month + 1, 0)).getUTCDate();
}

interface WallTime {
  y: number;
  mo: number;
  d: number;
  h: number;
  mi: number;
  s: number;
  ms: number;
}

function wallTimeOf(m: RegExpExecArray): WallTime | null {
  const [y, mo, d, h, mi] = [1, 2, 3, 4, 5].map((i) => Number(m[i]));
  const s = m[6] ? Number(m[6]) : 0;
  const ms = m[7] ? Number(m[7].padEnd(3, '0').slice(0, 3)) : 0;
  if (mo < 1 || mo > 12 || d < 1 || d > daysIn(y, mo) || h > 23 || mi > 59 || s > 59) return null;
  return { y, mo, d, h, mi, s, ms };
}

/**
 * Minutes east of UTC of an offset like "+02:00", "-0530", "+01", "Z"; or why it is refused:
 * hours above 23 or minutes above 59 are not ISO 8601 (§4.2.5.1), and offsets outside
 * −12:00…+14:00 are used nowhere on Earth, so a logger sending one has a broken clock setting.
 */
function offsetMinutes(offset: string): number | string {
  if (offset.toUpperCase() === 'Z') return 0;
  const sign = offset[0] === '-' ? -1 : 1;
  const digits = offset.slice(1).replace(':', '');
  const hours = Number(digits.slice(0, 2));
  const minutes = Number(digits.slice(2) || '0');
  if (hours > 23 || minutes > 59) return `offset "${offset}" is not a valid UTC offset (hours 00–23, minutes 00–59)`;
  const total = sign * (hours * 60 + minutes);
  if (total < MIN_OFFSET_MINUTES || total > MAX_OFFSET_MINUTES) return `offset "${offset}" is outside the UTC offsets in use (−12:00 to +14:00)`;
  return total;
}

/**
 * UTC epoch ms of a wall-clock time in an IANA zone: a time that falls in a daylight-saving gap
 * does not exist there and is refused, a repeated hour takes the first occurrence (the rule of
 * `instantOfWallClock`), because guessing would put a reading an hour off.
 */
function inZone(w: WallTime, timeZone: string): number | null {
  return instantOfWallClock(utcMs(w.y, w.mo, w.d, w.h, w.mi, w.s, w.ms), timeZone);
}

export type TimeFormat = 'auto' | 'iso' | 'epoch-ms' | 'epoch-s';

/**
 * Reads a reading's time: ISO 8601 with a UTC offset ("2026-03-01T06:00:00+01:00", "…Z"),
 * epoch milliseconds (a JSON number or a string of digits), or — for uploads that name a
 * time zone — an ISO local time interpreted in that zone. Fractions beyond milliseconds are
 * truncated (readings are stored in ms). A local time with no zone to interpret it is refused
 * rather than assumed to be UTC. Epoch milliseconds must be whole; offsets must be valid
 * ISO 8601 and in use on Earth (−12:00…+14:00); a number beyond ±8.64e15 ms (what a Date can
 * hold) is refused as `time_out_of_range` instead of overflowing later.
 */
export function parseReadingTime(raw: unknown, opts: { format?: TimeFormat; timeZone?: string } = {}): TimeParse {
  const format = opts.format ?? 'auto';
  if (typeof raw === 'number') {
    if (format === 'iso') return bad('ts: expected an ISO 8601 time, got a number');
    if (!Number.isFinite(raw)) return bad('ts: not a finite number');
    if (format === 'epoch-s') return inRange(Math.round(raw * 1000), String(raw));
    // a fraction of a millisecond is refused, as the same number sent as text is
    if (!Number.isInteger(raw)) return bad(`ts: ${String(raw).slice(0, 40)} is not whole epoch milliseconds`);
    return inRange(raw, String(raw));
  }
  if (typeof raw !== 'string' || raw.trim() === '') return bad('ts: missing');
  const s = raw.trim();
  if (format !== 'iso' && DIGITS.test(s)) {
    const n = Number(s);
    return inRange(format === 'epoch-s' ? n * 1000 : n, s);
  }
  if (format === 'epoch-s' && DECIMAL.test(s)) return inRange(Math.round(Number(s) * 1000), s);
  if (format !== 'iso' && DECIMAL.test(s)) return bad(`ts: "${s.slice(0, 40)}" is not whole epoch milliseconds`);
  if (format === 'epoch-ms' || format === 'epoch-s') return bad(`ts: "${s.slice(0, 40)}" is not an epoch time`);
  const withOffset = ISO_WITH_OFFSET.exec(s);
  if (withOffset) {
    const w = wallTimeOf(withOffset);
    if (!w) return bad(`ts: "${s.slice(0, 40)}" is not a valid date and time`);
    const offset = offsetMinutes(withOffset[8]);
    if (typeof offset === 'string') return bad(`ts: "${s.slice(0, 40)}": ${offset}`);
    return { ok: true, ts: utcMs(w.y, w.mo, w.d, w.h, w.mi, w.s, w.ms) - offset * 60_000 };
  }
  const local = ISO_LOCAL.exec(s);
  if (local) {
    if (!opts.timeZone) return bad(`ts: "${s.slice(0, 40)}" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds)`);
    const w = wallTimeOf(local);
    if (!w) return bad(`ts: "${s.slice(0, 40)}" is not a valid date and time`);
    const ts = inZone(w, opts.timeZone);
    if (ts === null) return bad(`ts: "${s.slice(0, 40)}" does not exist in ${opts.timeZone} (daylight-saving change)`);
    return { ok: true, ts };
  }
  return bad(`ts: "${s.slice(0, 40)}" is not an ISO 8601 time or epoch milliseconds`);
}
