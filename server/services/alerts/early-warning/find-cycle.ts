import { detectPeriod } from '../../../analysis/index.ts';

/** Fewest whole cycles the history must hold before a cycle is taken off (two to fit it, one more to trust it). */
export const MIN_CYCLES = 3;

/** False-alarm level of the periodogram test for the daily cycle (the period search's own default). */
const ALPHA = 0.01;

/**
 * The channel's cycle in grid steps, or null: the period search's best significant period
 * ({@link detectPeriod}, calendar periods snapped, false-alarm level 0.01); failing that, the
 * calendar day when its periodogram peak alone is significant at that level. The search asks a
 * cycle seen fewer than six times to show in the autocorrelation as well, which three days of a
 * persistent room seldom clear although the daily cycle is plain in the spectrum; the day is the
 * cycle rooms, glasshouses and fields are known to have, so its spectral evidence is enough here
 * (our own rule for the projection; the diagnostics keep the stricter one). The history must hold
 * {@link MIN_CYCLES} of it. Run on a complete (filled) grid; null when it is too short to search.
 *
 * Cost: O(n log n).
 */
export function findCycle(values: Float64Array, stepMs: number): number | null {
  if (values.length < 8 * MIN_CYCLES) return null;
  const found = detectPeriod(values, { stepMs, maxPeriod: Math.floor(values.length / MIN_CYCLES), alpha: ALPHA });
  const day = found.candidates.find((c) => c.calendar === 'day' && c.pValue < ALPHA && c.harmonicOf === null);
  const period = found.best ?? day?.period ?? null;
  return period !== null && period >= 2 && values.length >= MIN_CYCLES * period ? period : null;
}

/** The cycle in words for the model sentence: "daily cycle", "12-hour cycle", "90-minute cycle". */
export function cycleWords(periodSteps: number, stepMs: number): string {
  const ms = periodSteps * stepMs;
  if (ms === 86_400_000) return 'daily cycle';
  if (ms === 7 * 86_400_000) return 'weekly cycle';
  if (ms % 3_600_000 === 0) return `${ms / 3_600_000}-hour cycle`;
  if (ms % 60_000 === 0) return `${ms / 60_000}-minute cycle`;
  return `${periodSteps}-step cycle`;
}
