import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { wallClockText } from '../../policies/time-zones.ts';
import { instantOfWallClock, naiveUtcMs } from './wall-clock-instant.ts';

// Daylight-saving rules, IANA tz database: the EU changes on the last Sunday of March and of
// October at 01:00 UTC (Europe/Berlin 2026-03-29 and 2026-10-25); the US on the second Sunday
// of March and the first Sunday of November at 02:00 local (America/New_York 2026-03-08 and
// 2026-11-01). Every expected instant below was checked on this machine with /usr/bin/python3
// zoneinfo (fold=0 for the first occurrence, and a round trip to detect gaps); the Berlin overlap
// also with `TZ=Europe/Berlin date -d '2026-10-25 02:30 CEST' -u` (2026-10-25T00:30:00Z), and
// both gap times are refused by GNU date ("invalid date").
const at = (zone: string, y: number, mo: number, d: number, h: number, mi: number) => instantOfWallClock(naiveUtcMs(y, mo, d, h, mi), zone);

describe('instantOfWallClock', () => {
  it('refuses wall times skipped by the spring change in both zones', () => {
    expect(at('Europe/Berlin', 2026, 3, 29, 2, 30)).toBeNull();
    expect(at('Europe/Berlin', 2026, 3, 29, 2, 0)).toBeNull();
    expect(at('America/New_York', 2026, 3, 8, 2, 30)).toBeNull();
  });

  it('reads the minutes either side of the spring gap', () => {
    expect(at('Europe/Berlin', 2026, 3, 29, 1, 59)).toBe(Date.UTC(2026, 2, 29, 0, 59)); // python: 1774745940000
    expect(at('Europe/Berlin', 2026, 3, 29, 3, 0)).toBe(Date.UTC(2026, 2, 29, 1, 0)); // python: 1774746000000
    expect(at('America/New_York', 2026, 3, 8, 1, 59)).toBe(Date.UTC(2026, 2, 8, 6, 59)); // python: 1772953140000
    expect(at('America/New_York', 2026, 3, 8, 3, 0)).toBe(Date.UTC(2026, 2, 8, 7, 0)); // python: 1772953200000
  });

  it('takes the first occurrence of a repeated hour in both zones (east and west of UTC)', () => {
    // Berlin 02:30 happens at 00:30Z (CEST, +2) and again at 01:30Z (CET, +1)
    expect(at('Europe/Berlin', 2026, 10, 25, 2, 30)).toBe(Date.UTC(2026, 9, 25, 0, 30)); // python fold=0: 1792888200000
    // New York 01:30 happens at 05:30Z (EDT, −4) and again at 06:30Z (EST, −5)
    expect(at('America/New_York', 2026, 11, 1, 1, 30)).toBe(Date.UTC(2026, 10, 1, 5, 30)); // python fold=0: 1793511000000
  });

  it('reads the first time after the repeated hour on standard time', () => {
    expect(at('Europe/Berlin', 2026, 10, 25, 3, 0)).toBe(Date.UTC(2026, 9, 25, 2, 0)); // python: 1792893600000
    expect(at('America/New_York', 2026, 11, 1, 2, 0)).toBe(Date.UTC(2026, 10, 1, 7, 0)); // python: 1793516400000
  });

  it('keeps years below 100 as given', () => {
    expect(new Date(naiveUtcMs(50, 1, 2)).getUTCFullYear()).toBe(50);
    expect(at('UTC', 50, 1, 2, 3, 4)).toBe(naiveUtcMs(50, 1, 2, 3, 4));
  });

  it('round-trips the wall clock of any instant to that instant or an earlier one with the same wall clock', () => {
    // property: wall(t) read back gives t, or — inside a repeated hour — the earlier instant one hour before
    fc.assert(
      fc.property(
        fc.constantFrom('Europe/Berlin', 'America/New_York', 'Australia/Lord_Howe', 'Asia/Kolkata'),
        fc.integer({ min: Date.UTC(2000, 0, 1) / 60_000, max: Date.UTC(2040, 0, 1) / 60_000 }),
        (zone, minute) => {
          const t = minute * 60_000;
          const [date, time] = wallClockText(zone, t).split(' ');
          const [y, mo, d] = date.split('-').map(Number);
          const [h, mi] = time.split(':').map(Number);
          const back = instantOfWallClock(naiveUtcMs(y, mo, d, h, mi), zone);
          expect(back).not.toBeNull();
          expect(wallClockText(zone, back!)).toBe(wallClockText(zone, t));
          expect(back! <= t && t - back! <= 3_600_000).toBe(true);
        },
      ),
      { numRuns: 300, seed: 20261203 },
    );
  });
});
