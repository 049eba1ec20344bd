import { detectPeriod } from '../../../analysis/index.ts';

/** Fewest whole cycles the history must hold before a cycle is taken off (two to fit it, one more to trust it). */
export const MIN_CYCLES = 3;

/**
 * The channel's cycle in grid steps, or null: the period search's best significant period
 * ({@link detectPeriod}, calendar periods snapped, false-alarm level 0.01) when the history
 * holds at least {@link MIN_CYCLES} of it; a daily cycle is the usual case for rooms, glasshouses
 * and fields. Run on a complete (filled) grid. Null when the history is too short to search.
 *
 * Cost: O(n log n).
 */
export function findCycle(values: Float64Array, stepMs: number): number | null {
  if (values.length < 8 * MIN_CYCLES) return null;
  const found = detectPeriod(values, { stepMs, maxPeriod: Math.floor(values.length / MIN_CYCLES) });
  return found.best !== null && found.best >= 2 && values.length >= MIN_CYCLES * found.best ? found.best : null;
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
