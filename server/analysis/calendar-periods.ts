import { AnalysisInputError } from './analysis-input-error.ts';

/** The calendar cycles a logger's grid can carry. */
export type CalendarName = 'hour' | 'day' | 'week' | 'days' | 'hours';

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
 * Whole numbers of days from 2 to 6 that are a whole number of grid steps between 2 and
 * `maxPeriod` (name 'days'): cycles such as watering every other day. They are not tested at
 * their own frequency as the hour, day and week are (that would add tests for cycles few
 * channels have), but a cycle the open search finds within one Fourier bin of one of them is
 * reported as exactly that many steps, for the same reason as the calendar periods.
 *
 * Cost: O(1).
 */
export function dayMultiples(stepMs: number, maxPeriod: number): CalendarPeriod[] {
  const day = calendarPeriods(stepMs, Number.MAX_SAFE_INTEGER).find((c) => c.name === 'day');
  if (!day) return [];
  const out: CalendarPeriod[] = [];
  for (let k = 2; k <= 6; k++) if (k * day.steps <= maxPeriod) out.push({ name: 'days', steps: k * day.steps });
  return out;
}

/**
 * The whole-hour parts of a day — 12, 8, 6, 4, 3 and 2 hours (a day divided by 2, 3, 4, 6, 8,
 * 12) — that are a whole number of grid steps between 2 and `maxPeriod` (name 'hours'): cycles
 * such as a freezer's defrost every 6 hours or a half-day pattern. Like the day multiples they are
 * not tested at their own frequency; a cycle the open search finds within one Fourier bin of one
 * of them is reported as exactly that many steps (a raw 143.2 steps on a 5-minute grid is 12
 * hours within the resolution of the record, not a cycle of 143 steps).
 *
 * Cost: O(1).
 */
export function dayParts(stepMs: number, maxPeriod: number): CalendarPeriod[] {
  const day = calendarPeriods(stepMs, Number.MAX_SAFE_INTEGER).find((c) => c.name === 'day');
  if (!day) return [];
  const out: CalendarPeriod[] = [];
  for (const parts of [2, 3, 4, 6, 8, 12]) {
    const steps = day.steps / parts;
    if (Number.isInteger(steps) && steps >= 2 && steps <= maxPeriod) out.push({ name: 'hours', steps });
  }
  return out;
}
