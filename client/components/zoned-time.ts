/**
 * Instants shown in a logger's own time zone (IANA name), with the UTC offset spelled out, and
 * wall-clock times typed in that zone turned back into instants. Uses only the platform's
 * `Intl.DateTimeFormat`, which carries the IANA time zone database (one formatter per zone, shared
 * with the server's mail times through `@shared/policies/time-zones.ts`).
 */
import { wallClockFormatter } from '@shared/policies/time-zones.ts';

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function wallClock(ms: number, timeZone: string): WallClock {
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

/** `2026-01-31 14:05` (or with `:ss`) as the clock in `timeZone` read at instant `ms`. */
export function formatZoned(ms: number, timeZone: string, { seconds = false, date = true } = {}): string {
  const w = wallClock(ms, timeZone);
  const time = `${pad(w.hour)}:${pad(w.minute)}${seconds ? `:${pad(w.second)}` : ''}`;
  return date ? `${w.year}-${pad(w.month)}-${pad(w.day)} ${time}` : time;
}

/** The value a `datetime-local` input shows for instant `ms` in `timeZone` (`2026-01-31T14:05`). */
export function toZonedInput(ms: number, timeZone: string): string {
  return formatZoned(ms, timeZone).replace(' ', 'T');
}

/**
 * The instant at which the clock in `timeZone` reads `local` (`YYYY-MM-DDTHH:mm[:ss]`), or
 * null when `local` cannot be read. In a spring-forward gap the later offset is used; in an
 * autumn overlap the first (earlier-offset) reading wins after one correction step.
 */
export function fromZonedInput(local: string, timeZone: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(local);
  if (!m) return null;
  const naive = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]), Number(m[6] ?? 0));
  if (Number.isNaN(naive)) return null;
  const first = naive - zoneOffsetMinutes(naive, timeZone) * 60_000;
  return naive - zoneOffsetMinutes(first, timeZone) * 60_000;
}
