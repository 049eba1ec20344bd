/**
 * Wall-clock readings of a named zone turned into instants, with what happened on the way: the
 * reading exists once, twice (the hour repeated when the clocks go back) or not at all (the hour
 * the clocks skip when they go forward). Shared by the date-time input (to say so) and the chart
 * time axis (to place ticks at local midnights and whole hours).
 */
import { zoneOffsetMinutes } from './clock/format.ts';

const MINUTE = 60_000;
const DAY = 86_400_000;

/** How a wall-clock reading maps to instants in a zone. */
export interface WallClockInstant {
  /** The instant used: the first of two in a repeated hour; in a skipped hour, see `skipped`. */
  ms: number;
  /** The reading does not exist on that day: the clock jumps over it. */
  skipped: boolean;
  /** The reading happens twice that day; `ms` is the first time. */
  repeated: boolean;
}

/**
 * The instant at which the clock of `timeZone` reads `wall` (the reading's fields written as if
 * they were a UTC instant, i.e. `Date.UTC(y, m − 1, d, h, min)`). Follows Python's `zoneinfo`
 * with `fold=0` (PEP 495, "Local Time Disambiguation", section "Mind the gap"): a repeated
 * reading takes its first instant; a skipped reading is read with the offset in force before the
 * change, so 02:30 on the spring day in Berlin (UTC+01:00 → +02:00) becomes 03:30, and 00:00 on a
 * day whose midnight is skipped becomes the first instant of that day. The zone's offsets come
 * from the platform's IANA time zone database (`Intl.DateTimeFormat`); changes are assumed to be
 * more than a day apart, as they are in every zone of the database.
 */
export function instantAtWallClock(wall: number, timeZone: string): WallClockInstant {
  const before = zoneOffsetMinutes(wall - DAY, timeZone) * MINUTE;
  const after = zoneOffsetMinutes(wall + DAY, timeZone) * MINUTE;
  const readsWall = (ms: number) => ms + zoneOffsetMinutes(ms, timeZone) * MINUTE === wall;
  const fits = [...new Set([wall - before, wall - after])].filter(readsWall).sort((a, b) => a - b);
  if (fits.length === 0) return { ms: wall - before, skipped: true, repeated: false };
  return { ms: fits[0], skipped: false, repeated: fits.length > 1 };
}

/** The wall-clock reading of `timeZone` at instant `ms`, as `Date.UTC` of its fields (seconds dropped). */
export function wallClockAt(ms: number, timeZone: string): number {
  return Math.floor((ms + zoneOffsetMinutes(ms, timeZone) * MINUTE) / MINUTE) * MINUTE;
}
