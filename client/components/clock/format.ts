/**
 * Lagbook's one way of writing an instant for people: 24-hour, ISO-like dates
 * (`2026-12-03 14:00`), the zone named by its UTC offset (`UTC+01:00`, or `UTC` for UTC itself),
 * and the IANA name kept for a caption or `title` (`Europe/Berlin, UTC+01:00`). Also the
 * primitives behind it: the wall clock of a zone at an instant, the zone's offset, and a
 * wall-clock time typed in a zone turned back into an instant. Uses only the platform's
 * `Intl.DateTimeFormat`, which carries the IANA time zone database (one formatter per zone,
 * shared with the server's mail times through `@shared/policies/time-zones.ts`).
 *
 * Every page formats times through this folder; `one-clock.test.ts` fails on a page that
 * formats a time on its own.
 */
import { wallClockFormatter } from '@shared/policies/time-zones.ts';

/** The reading of a zone's clock at one instant. */
export interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

/** The clock in `timeZone` read at instant `ms` (24-hour; month 1–12). */
export function wallClock(ms: number, timeZone: string): WallClock {
  const p: Record<string, number> = {};
  for (const part of wallClockFormatter(timeZone).formatToParts(ms)) if (part.type !== 'literal') p[part.type] = Number(part.value);
  return { year: p.year, month: p.month, day: p.day, hour: p.hour, minute: p.minute, second: p.second };
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** Minutes the zone is ahead of UTC at instant `ms` (e.g. 60 for Europe/Berlin in January). */
export function zoneOffsetMinutes(ms: number, timeZone: string): number {
  const w = wallClock(ms, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return Math.round((asUtc - Math.floor(ms / 1000) * 1000) / 60_000);
}

/** An offset in minutes as `UTC+01:00` / `UTC−03:30` / `UTC+00:00`. */
export function formatOffset(minutes: number): string {
  const sign = minutes < 0 ? '−' : '+';
  const m = Math.abs(minutes);
  return `UTC${sign}${pad(Math.floor(m / 60))}:${pad(m % 60)}`;
}

/** The zone's offset at `ms`, as {@link formatOffset} writes it. */
export function zoneOffsetLabel(ms: number, timeZone: string): string {
  return formatOffset(zoneOffsetMinutes(ms, timeZone));
}

/** True for the names that mean UTC itself (not a zone that merely has offset 0 today, like Europe/London in winter). */
export function isUtcZone(timeZone: string): boolean {
  return ['UTC', 'Etc/UTC', 'Etc/Universal', 'Etc/Zulu', 'Universal', 'Zulu', 'Etc/GMT', 'GMT'].includes(timeZone);
}

/**
 * The short zone name shown after a time: `UTC` for UTC itself, else the zone's offset at that
 * instant (`UTC+01:00`), which changes across daylight-saving days as the clock does.
 */
export function zoneLabel(ms: number, timeZone: string): string {
  return isUtcZone(timeZone) ? 'UTC' : zoneOffsetLabel(ms, timeZone);
}

/** The long zone name for a caption or `title`: `Europe/Berlin, UTC+01:00` (just `UTC` for UTC). */
export function zoneCaption(ms: number, timeZone: string): string {
  return isUtcZone(timeZone) ? 'UTC' : `${timeZone.replaceAll('_', ' ')}, ${zoneOffsetLabel(ms, timeZone)}`;
}

/** `2026-01-31 14:05` (or with `:ss`) as the clock in `timeZone` read at instant `ms`; no zone named. */
export function formatZoned(ms: number, timeZone: string, { seconds = false, date = true } = {}): string {
  const w = wallClock(ms, timeZone);
  const time = `${pad(w.hour)}:${pad(w.minute)}${seconds ? `:${pad(w.second)}` : ''}`;
  return date ? `${w.year}-${pad(w.month)}-${pad(w.day)} ${time}` : time;
}

/** What {@link formatInstant} writes: the date and time (default), the date alone or the time alone. */
export type InstantPart = 'datetime' | 'date' | 'time';

export interface FormatInstantOptions {
  /** Add `:ss`. */
  seconds?: boolean;
  /** Default `datetime`. */
  part?: InstantPart;
  /** Name the zone after the text; default true for `datetime`/`time`, false for `date` (a day has no offset of its own). */
  named?: boolean;
}

/**
 * The one display form of an instant: `2026-12-03 14:00 UTC+01:00` on the clock of `timeZone`
 * (`2026-12-03 13:00 UTC` for UTC), with options for seconds, date only (`2026-12-03`) or time
 * only (`14:00 UTC+01:00`). Date form after ISO 8601 (calendar date, 24-hour time).
 */
export function formatInstant(ms: number, timeZone: string, { seconds = false, part = 'datetime', named }: FormatInstantOptions = {}): string {
  const w = wallClock(ms, timeZone);
  const date = `${w.year}-${pad(w.month)}-${pad(w.day)}`;
  const time = `${pad(w.hour)}:${pad(w.minute)}${seconds ? `:${pad(w.second)}` : ''}`;
  const text = part === 'date' ? date : part === 'time' ? time : `${date} ${time}`;
  return (named ?? part !== 'date') ? `${text} ${zoneLabel(ms, timeZone)}` : text;
}

/** An instant from the API (ISO 8601 text or epoch ms) as epoch ms, or null when it cannot be read. */
export function instantMs(at: string | number | Date): number | null {
  const ms = typeof at === 'number' ? at : typeof at === 'string' ? Date.parse(at) : at.getTime();
  return Number.isFinite(ms) ? ms : null;
}

/** The value a wall-clock input shows for instant `ms` in `timeZone` (`2026-01-31T14:05`). */
export function toZonedInput(ms: number, timeZone: string): string {
  return formatZoned(ms, timeZone).replace(' ', 'T');
}

const UNITS: Array<[Intl.RelativeTimeFormatUnit, number]> = [
  ['year', 365 * 86_400_000],
  ['month', 30 * 86_400_000],
  ['week', 7 * 86_400_000],
  ['day', 86_400_000],
  ['hour', 3_600_000],
  ['minute', 60_000],
  ['second', 1000],
];
const RELATIVE = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });

/**
 * How long ago (or ahead) instant `ms` is from `now`, in the largest whole unit that fits
 * ("12 minutes ago", "yesterday", "in 2 hours"), worded by the platform's
 * `Intl.RelativeTimeFormat` in English like the rest of the app. Months count as 30 days and
 * years as 365: close enough for "last seen", never for sums.
 */
export function relativeText(ms: number, now: number): string {
  const diff = ms - now;
  for (const [unit, size] of UNITS) {
    if (Math.abs(diff) >= size) return RELATIVE.format(Math.trunc(diff / size), unit);
  }
  return RELATIVE.format(0, 'second');
}
