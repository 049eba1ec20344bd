import { wallClockFormatter } from '../../policies/time-zones.ts';

/** Result of reading one time field: epoch milliseconds, or why it could not be read. */
export type TimeParse = { ok: true; ts: number } | { ok: false; reason: string };

const ISO_WITH_OFFSET = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?(Z|[+-]\d{2}(?::?\d{2})?)$/i;
const ISO_LOCAL = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?$/;
const DIGITS = /^-?\d{1,16}$/;

/** Days in a month of the proleptic Gregorian calendar. */
function daysIn(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
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

/** UTC epoch ms of a wall-clock time at a fixed offset like "+02:00", "-0530", "Z". */
function atOffset(w: WallTime, offset: string): number {
  const utc = Date.UTC(w.y, w.mo - 1, w.d, w.h, w.mi, w.s, w.ms);
  if (offset.toUpperCase() === 'Z') return utc;
  const sign = offset[0] === '-' ? -1 : 1;
  const digits = offset.slice(1).replace(':', '');
  const minutes = Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2) || '0');
  return utc - sign * minutes * 60_000;
}

const offsetCache = new Map<string, number>();

/**
 * The offset (ms) of an IANA time zone at a UTC instant, from the platform's time zone data.
 * Zone offsets change on whole quarter hours at most, so offsets are cached per 15 minutes.
 */
function zoneOffsetMs(timeZone: string, utcMs: number): number {
  const slot = `${timeZone}|${Math.floor(utcMs / 900_000)}`;
  const cached = offsetCache.get(slot);
  if (cached !== undefined) return cached;
  const offset = computeZoneOffsetMs(timeZone, utcMs);
  if (offsetCache.size > 200_000) offsetCache.clear();
  offsetCache.set(slot, offset);
  return offset;
}

function computeZoneOffsetMs(timeZone: string, utcMs: number): number {
  const parts = wallClockFormatter(timeZone).formatToParts(new Date(utcMs));
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  const asUtc = Date.UTC(get('year'), get('month') - 1, get('day'), get('hour'), get('minute'), get('second'));
  return asUtc - Math.floor(utcMs / 1000) * 1000;
}

/**
 * UTC epoch ms of a wall-clock time in an IANA zone. Two passes settle the offset; a time that
 * falls in a daylight-saving gap does not exist there and is refused (a repeated hour takes
 * the first occurrence), because guessing would put a reading an hour off.
 */
function inZone(w: WallTime, timeZone: string): number | null {
  const naive = Date.UTC(w.y, w.mo - 1, w.d, w.h, w.mi, w.s, w.ms);
  let guess = naive - zoneOffsetMs(timeZone, naive);
  guess = naive - zoneOffsetMs(timeZone, guess);
  const check = guess + zoneOffsetMs(timeZone, guess);
  return check === naive ? guess : null;
}

export type TimeFormat = 'auto' | 'iso' | 'epoch-ms' | 'epoch-s';

/**
 * Reads a reading's time: ISO 8601 with a UTC offset ("2026-03-01T06:00:00+01:00", "…Z"),
 * epoch milliseconds (a JSON number or a string of digits), or — for uploads that name a
 * time zone — an ISO local time interpreted in that zone. Fractions beyond milliseconds are
 * truncated (readings are stored in ms). A local time with no zone to interpret it is refused
 * rather than assumed to be UTC.
 */
export function parseReadingTime(raw: unknown, opts: { format?: TimeFormat; timeZone?: string } = {}): TimeParse {
  const format = opts.format ?? 'auto';
  if (typeof raw === 'number') {
    if (format === 'iso') return { ok: false, reason: 'ts: expected an ISO 8601 time, got a number' };
    const ts = format === 'epoch-s' ? raw * 1000 : raw;
    if (!Number.isFinite(ts) || !Number.isInteger(Math.round(ts))) return { ok: false, reason: 'ts: not a finite number' };
    return { ok: true, ts: Math.round(ts) };
  }
  if (typeof raw !== 'string' || raw.trim() === '') return { ok: false, reason: 'ts: missing' };
  const s = raw.trim();
  if (format !== 'iso' && DIGITS.test(s)) {
    const n = Number(s);
    return { ok: true, ts: format === 'epoch-s' ? n * 1000 : n };
  }
  if (format === 'epoch-s' && /^-?\d+(\.\d+)?$/.test(s)) return { ok: true, ts: Math.round(Number(s) * 1000) };
  if (format === 'epoch-ms' || format === 'epoch-s') return { ok: false, reason: `ts: "${s.slice(0, 40)}" is not an epoch time` };
  const withOffset = ISO_WITH_OFFSET.exec(s);
  if (withOffset) {
    const w = wallTimeOf(withOffset);
    if (!w) return { ok: false, reason: `ts: "${s.slice(0, 40)}" is not a valid date and time` };
    return { ok: true, ts: atOffset(w, withOffset[8]) };
  }
  const local = ISO_LOCAL.exec(s);
  if (local) {
    if (!opts.timeZone) return { ok: false, reason: `ts: "${s.slice(0, 40)}" has no UTC offset (add Z or ±hh:mm, or send epoch milliseconds)` };
    const w = wallTimeOf(local);
    if (!w) return { ok: false, reason: `ts: "${s.slice(0, 40)}" is not a valid date and time` };
    const ts = inZone(w, opts.timeZone);
    if (ts === null) return { ok: false, reason: `ts: "${s.slice(0, 40)}" does not exist in ${opts.timeZone} (daylight-saving change)` };
    return { ok: true, ts };
  }
  return { ok: false, reason: `ts: "${s.slice(0, 40)}" is not an ISO 8601 time or epoch milliseconds` };
}
