import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { finestRollupFor, finestRollupSql, isKept, keptLevels, levelForBuckets } from './rollup-levels.ts';

describe('finestRollupFor', () => {
  it('keeps every level below a minute', () => {
    expect(finestRollupFor(1)).toBe(60);
    expect(finestRollupFor(10)).toBe(60);
    expect(finestRollupFor(59)).toBe(60);
  });

  it('drops the minute level at one minute and slower (a minute bucket would hold one reading)', () => {
    expect(finestRollupFor(60)).toBe(3600);
    expect(finestRollupFor(300)).toBe(3600);
    expect(finestRollupFor(3599)).toBe(3600);
  });

  it('keeps only the day level from an hour on, and none from a day on', () => {
    expect(finestRollupFor(3600)).toBe(86400);
    expect(finestRollupFor(86399)).toBe(86400);
    expect(finestRollupFor(86400)).toBeNull();
    expect(finestRollupFor(604800)).toBeNull();
  });

  it('refuses an interval that is not a positive number', () => {
    expect(() => finestRollupFor(0)).toThrow('finestRollupFor: interval must be a positive number of seconds (got 0)');
    expect(() => finestRollupFor(Number.NaN)).toThrow('got NaN');
  });

  it('always picks a level strictly coarser than the interval, and the finest such', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 604800 }), (s) => {
        const floor = finestRollupFor(s);
        if (floor === null) expect(s).toBeGreaterThanOrEqual(86400);
        else {
          expect(floor).toBeGreaterThan(s);
          expect(keptLevels(floor).every((r) => r > s)).toBe(true);
          expect([60, 3600, 86400].filter((r) => r < floor).every((r) => r <= s)).toBe(true);
        }
      }),
    );
  });
});

describe('keptLevels and isKept', () => {
  it('keeps the floor and every coarser level', () => {
    expect(keptLevels(60)).toEqual([60, 3600, 86400]);
    expect(keptLevels(3600)).toEqual([3600, 86400]);
    expect(keptLevels(86400)).toEqual([86400]);
    expect(keptLevels(null)).toEqual([]);
    expect(isKept(60, 3600)).toBe(false);
    expect(isKept(86400, 3600)).toBe(true);
    expect(isKept(86400, null)).toBe(false);
  });
});

describe('levelForBuckets', () => {
  it('reads the wanted level where it is kept', () => {
    expect(levelForBuckets(60, 60, 600_000)).toBe(60);
  });

  it('moves to a coarser kept level only when its buckets tile the width', () => {
    expect(levelForBuckets(60, 3600, 7_200_000)).toBe(3600);
    expect(levelForBuckets(60, 3600, 600_000)).toBeNull();
    expect(levelForBuckets(3600, 86400, 86_400_000 * 3)).toBe(86400);
    expect(levelForBuckets(3600, 86400, 3_600_000 * 5)).toBeNull();
  });

  it('reads raw readings when nothing is kept or nothing was wanted', () => {
    expect(levelForBuckets(86400, null, 86_400_000)).toBeNull();
    expect(levelForBuckets(null, 60, 30_000)).toBeNull();
  });
});

describe('finestRollupSql', () => {
  it('writes the same thresholds as a CASE expression', () => {
    expect(finestRollupSql('x')).toBe('CASE WHEN x < 60 THEN 60 WHEN x < 3600 THEN 3600 WHEN x < 86400 THEN 86400 ELSE NULL END');
  });
});
