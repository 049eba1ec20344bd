import { wallClockFormatter } from '../../policies/time-zones.ts';

const DAY_MS = 86_400_000;

/** Epoch ms of a wall-clock time read as if it were UTC; unlike `Date.UTC`, years 0–99 stay as given. */
export function naiveUtcMs(y: number, mo: number, d: number, h = 0, mi = 0, s = 0, ms = 0): number {
  const date = new Date(Date.UTC(2000, mo - 1, d, h, mi, s, ms));
  date.setUTCFullYear(y, mo - 1, d);
  return date.getTime();
}

const offsetCache = new Map<string, number>();

/**
 * Offset (ms east of UTC) of an IANA zone at a UTC instant, from the platform's tz data. Zone
 * offsets change on whole quarter hours at most, so offsets are cached per 15 minutes (reading
 * a formatter's parts costs far more than a map lookup, and ingestion asks once per local time).
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

/** The offset at an instant, read from the zone's wall clock (whole seconds). */
function computeZoneOffsetMs(timeZone: string, utcMs: number): number {
  const parts = wallClockFormatter(timeZone).formatToParts(new Date(utcMs));
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  const whole = Math.floor(utcMs / 1000) * 1000;
  return naiveUtcMs(get('year'), get('month'), get('day'), get('hour'), get('minute'), get('second')) - whole;
}

/**
 * UTC epoch ms of a wall-clock time in an IANA zone, given as `naiveMs` (the wall clock read
 * as if it were UTC, see `naiveUtcMs`). Rule, the one `parse-reading-time.ts` documents for
 * local ISO times: a wall time in a daylight-saving gap does not exist there and gives `null`
 * (guessing would put a reading an hour off); a wall time in a repeated hour takes its FIRST
 * occurrence (the earlier instant, still on daylight time). Each offset the zone uses within a
 * day either side is tried, so the answer does not depend on which side of UTC the zone lies.
 */
export function instantOfWallClock(naiveMs: number, timeZone: string): number | null {
  const offsets = new Set([naiveMs - DAY_MS, naiveMs, naiveMs + DAY_MS].map((t) => zoneOffsetMs(timeZone, t)));
  let best: number | null = null;
  for (const offset of offsets) {
    const candidate = naiveMs - offset;
    if (candidate + zoneOffsetMs(timeZone, candidate) !== naiveMs) continue;
    if (best === null || candidate < best) best = candidate;
  }
  return best;
}
