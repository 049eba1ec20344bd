import { AnalysisInputError } from './analysis-input-error.ts';

/** The calendar cycles a logger's grid can carry. */
export type CalendarName = 'hour' | 'day' | 'week';

export interface CalendarPeriod {
  name: CalendarName;
  /** Length of the cycle in grid steps (a whole number). */
  steps: number;
}

const HOUR_MS = 3_600_000;
const CALENDAR_MS: ReadonlyArray<[CalendarName, number]> = [
  ['hour', HOUR_MS],
  ['day', 24 * HOUR_MS],
  ['week', 7 * 24 * HOUR_MS],
];

/**
 * The calendar periods (hour, day, week) that are a whole number of grid steps of `stepMs`
 * milliseconds, between 2 and `maxPeriod` steps, shortest first. A day sampled every 5 minutes
 * is 288 steps; a day sampled every 7 minutes is not a whole number of steps and is left out
 * (no exact cycle of the grid can match it). The lengths are civil-time conventions (an hour
 * of 3,600 s, a day of 86,400 s, a week of seven days; common practice, ignoring leap seconds
 * and daylight-saving shifts, which the logger grid in UTC does not see).
 *
 * Cost: O(1).
 */
export function calendarPeriods(stepMs: number, maxPeriod: number): CalendarPeriod[] {
  if (!(Number.isFinite(stepMs) && stepMs > 0)) {
    throw new AnalysisInputError(`calendarPeriods: stepMs must be a positive number of milliseconds (got ${stepMs})`);
  }
  const out: CalendarPeriod[] = [];
  for (const [name, ms] of CALENDAR_MS) {
    const steps = ms / stepMs;
    // A whole number of steps up to rounding of a non-integer stepMs (e.g. 1000/3 ms).
    const whole = Math.round(steps);
    if (Math.abs(steps - whole) > 1e-9 * steps) continue;
    if (whole >= 2 && whole <= maxPeriod) out.push({ name, steps: whole });
  }
  return out;
}

/**
 * The calendar period whose frequency 1/steps lies within one Fourier bin of `frequency`
 * (|f − 1/steps| ≤ 1/n cycles per step for a series of n values; the nearest if several do),
 * or null. One bin is the resolution of the periodogram of n values: two cycles closer than
 * 1/n in frequency cannot be told apart, and the peak of a single cycle is spread over
 * ±1/n (the Rayleigh limit; Priestley, *Spectral Analysis and Time Series*, 1981, §6.2.3 and
 * §7.5 on the bandwidth of the periodogram window; Brockwell & Davis, *Introduction to Time
 * Series and Forecasting*, 2nd ed., §4.2, the Fourier frequencies 2πj/n). A raw estimate this
 * close to a calendar period is therefore indistinguishable from it with n values.
 *
 * Cost: O(number of calendar periods).
 */
export function calendarPeriodNear(frequency: number, n: number, periods: readonly CalendarPeriod[]): CalendarPeriod | null {
  let best: CalendarPeriod | null = null;
  let bestGap = Infinity;
  for (const c of periods) {
    const gap = Math.abs(frequency - 1 / c.steps);
    if (gap <= 1 / n + 1e-15 && gap < bestGap) [best, bestGap] = [c, gap];
  }
  return best;
}
