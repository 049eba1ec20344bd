import { describe, expect, it } from 'vitest';
import { calendarPeriodNear } from './calendar-period-near.ts';
import { calendarPeriods, dayMultiples, dayParts } from './calendar-periods.ts';

const MINUTE = 60_000;

describe('calendarPeriods', () => {
  it('lists the hour, day and week that are whole numbers of steps, within 2..maxPeriod', () => {
    expect(calendarPeriods(5 * MINUTE, 2016)).toEqual([
      { name: 'hour', steps: 12 },
      { name: 'day', steps: 288 },
      { name: 'week', steps: 2016 },
    ]);
    expect(calendarPeriods(5 * MINUTE, 2015).map((c) => c.name)).toEqual(['hour', 'day']);
    // An hourly grid: the hour is one step, below 2, so it is not a cycle of the grid.
    expect(calendarPeriods(60 * MINUTE, 1000)).toEqual([
      { name: 'day', steps: 24 },
      { name: 'week', steps: 168 },
    ]);
    // 7 minutes: an hour is 8.57 steps and a day 205.7 steps; only the week (1440 steps) is whole.
    expect(calendarPeriods(7 * MINUTE, 5000)).toEqual([{ name: 'week', steps: 1440 }]);
    expect(calendarPeriods(1000 / 3, 20_000)).toEqual([{ name: 'hour', steps: 10_800 }]);
  });

  it('refuses a step that is not a positive number of milliseconds', () => {
    expect(() => calendarPeriods(0, 100)).toThrow('calendarPeriods: stepMs must be a positive number of milliseconds (got 0)');
    expect(() => calendarPeriods(Number.NaN, 100)).toThrow('(got NaN)');
  });
});

describe('calendarPeriodNear', () => {
  const periods = calendarPeriods(5 * MINUTE, 2016);
  it('snaps a raw frequency within one Fourier bin (1/n) of a calendar frequency, and no further', () => {
    const n = 4032; // two weeks of 5-minute steps: one bin is 1/4032 cycles per step
    expect(calendarPeriodNear(1 / 289.4, n, periods)?.name).toBe('day');
    expect(calendarPeriodNear(1 / 288 + 0.999 / n, n, periods)?.name).toBe('day');
    expect(calendarPeriodNear(1 / 288 - 1.001 / n, n, periods)).toBeNull();
    // 1/310 is 0.99 bins from 1/288 at n = 4032 but 2.5 bins at n = 10,000.
    expect(calendarPeriodNear(1 / 310, n, periods)?.name).toBe('day');
    expect(calendarPeriodNear(1 / 310, 10_000, periods)).toBeNull();
  });

  it('takes the nearest when two calendar frequencies are within one bin', () => {
    // n = 20: one bin is 0.05 cycles per step; the hour (1/12 ≈ 0.083) and the day (1/288 ≈ 0.003) are both within it of 0.04 and 0.045.
    expect(calendarPeriodNear(0.045, 20, periods)?.name).toBe('hour');
    expect(calendarPeriodNear(0.04, 20, periods)?.name).toBe('day');
  });

  it('lists 2 to 6 whole days for snapping when a day is a whole number of steps (dayMultiples)', () => {
    expect(dayMultiples(300_000, 10_000)).toEqual([2, 3, 4, 5, 6].map((k) => ({ name: 'days', steps: 288 * k })));
    expect(dayMultiples(300_000, 1000).map((c) => c.steps)).toEqual([576, 864]);
    expect(dayMultiples(7 * 60_000, 10_000)).toEqual([]); // a day is not a whole number of 7-minute steps
  });
});

describe('dayParts', () => {
  it('lists the whole-hour parts of a day (12, 8, 6, 4, 3, 2 h) that are whole numbers of steps, within 2..maxPeriod', () => {
    expect(dayParts(5 * MINUTE, 10_000)).toEqual([144, 96, 72, 48, 36, 24].map((steps) => ({ name: 'hours', steps })));
    // An hourly grid: 12, 8, 6, 4, 3 and 2 steps.
    expect(dayParts(60 * MINUTE, 10_000).map((c) => c.steps)).toEqual([12, 8, 6, 4, 3, 2]);
    // 45-minute steps: a day is 32 steps, so 8 h (10.67), 4 h, 2 h are not whole; 12 h = 16, 6 h = 8, 3 h = 4.
    expect(dayParts(45 * MINUTE, 10_000).map((c) => c.steps)).toEqual([16, 8, 4]);
    expect(dayParts(5 * MINUTE, 100).map((c) => c.steps)).toEqual([96, 72, 48, 36, 24]);
    // 7 minutes: a day is not a whole number of steps, so none of its parts is listed.
    expect(dayParts(7 * MINUTE, 10_000)).toEqual([]);
  });
});
