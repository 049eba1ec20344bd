import type { CalendarPeriod } from './calendar-periods.ts';

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
