import { wallClockFormatter } from '../../policies/time-zones.ts';

const DAY_MS = 86_400_000;

/** Epoch ms of a wall-clock time read as if it were UTC; unlike `Date.UTC`, years 0–99 stay as given. */
export function naiveUtcMs(y: number, mo: number, d: number, h = 0, mi = 0, s = 0, ms = 0): number {
  const date = new Date(Date.UTC(2000, mo - 1, d, h, mi, s, ms));
  date.setUTCFullYear(y, mo - 1, d);
  return date.getTime();
}

/** Offset (ms east of UTC) of an IANA zone at a UTC instant, from the platform's tz data (whole seconds). */
function zoneOffsetMs(timeZone: string, utcMs: number): number {
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
 * `offsetAt` gives a zone's offset at an instant (ingestion passes its cached one).
 */
export function instantOfWallClock(naiveMs: number, timeZone: string, offsetAt: (timeZone: string, utcMs: number) => number = zoneOffsetMs): number | null {
  const offsets = new Set([naiveMs - DAY_MS, naiveMs, naiveMs + DAY_MS].map((t) => offsetAt(timeZone, t)));
  let best: number | null = null;
  for (const offset of offsets) {
    const candidate = naiveMs - offset;
    if (candidate + offsetAt(timeZone, candidate) !== naiveMs) continue;
    if (best === null || candidate < best) best = candidate;
  }
  return best;
}
