import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { regularize } from './regularize.ts';

// Six readings, unsorted, on a 1-minute grid with an empty minute (hand-made example).
const MIN = 60_000;
const t0 = 1_700_000_040_000; // a whole minute in epoch ms
const timestamps = [t0 + 10_000, t0 + 2 * MIN + 5_000, t0 + 50_000, t0 + 20_000, t0 + 3 * MIN + 59_999, t0 + 2 * MIN + 5_000];
const values = [4, 10, 1, 7, 3, 12];

describe('regularize', () => {
  const grid = (agg: Parameters<typeof regularize>[2]['agg']) => Array.from(regularize(timestamps, values, { step: MIN, agg }).values);

  it('starts at the whole step before the first reading and covers to the last', () => {
    const r = regularize(timestamps, values, { step: MIN, agg: 'mean' });
    expect(r.start).toBe(t0);
    expect(r.step).toBe(MIN);
    expect(r.values.length).toBe(4);
  });

  it('aggregates each cell; empty cells are NaN', () => {
    expect(grid('mean')).toEqual([4, NaN, 11, 3]);
    expect(grid('sum')).toEqual([12, NaN, 22, 3]);
    expect(grid('count')).toEqual([3, NaN, 2, 1]);
    expect(grid('min')).toEqual([1, NaN, 10, 3]);
    expect(grid('max')).toEqual([7, NaN, 12, 3]);
    expect(grid('median')).toEqual([4, NaN, 11, 3]);
    // 'last' = latest timestamp (t0 + 50 s → 1); equal timestamps → the later one in input order (12).
    expect(grid('last')).toEqual([1, NaN, 12, 3]);
  });

  it('ignores NaN readings and honours an origin', () => {
    const r = regularize([0, 1000, 2000, 3000], [1, NaN, 3, 5], { step: 2000, agg: 'mean', origin: 500 });
    expect(r.start).toBe(-1500);
    expect(Array.from(r.values)).toEqual([1, 3, 5]);
  });

  it('median of an even count averages the middle pair', () => {
    expect(Array.from(regularize([0, 1, 2, 3], [9, 1, 5, 2], { step: 10, agg: 'median' }).values)).toEqual([3.5]);
  });

  it('rejects mismatched lengths and unknown aggregates', () => {
    expect(() => regularize([1, 2], [1], { step: 1, agg: 'mean' })).toThrow('regularize: timestamps and values must have the same length (got 2 and 1)');
    expect(() => regularize([1], [1], { step: 1, agg: 'mode' as never })).toThrow(
      'regularize: agg must be one of mean, last, min, max, median, sum, count (got mode)',
    );
  });

  it('gives each cell its only reading whether the readings come in grid order or not', () => {
    // Readings already on the grid take the shortcut; shuffled, the same readings take the
    // counting sort. Both must give each cell its only reading (count: 1), gaps NaN.
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 400 }), { minLength: 1, maxLength: 60 }),
        fc.constantFrom('mean', 'last', 'min', 'max', 'median', 'sum', 'count' as const),
        (cellList, agg) => {
          const cells = [...cellList].sort((a, b) => a - b);
          const ts = cells.map((c) => t0 + c * MIN + 7_000);
          const vs = cells.map((c) => Math.sin(c) * 100);
          const inOrder = regularize(ts, vs, { step: MIN, agg });
          const reversed = regularize([...ts].reverse(), [...vs].reverse(), { step: MIN, agg });
          const expected = new Array(cells[cells.length - 1] - cells[0] + 1).fill(NaN);
          cells.forEach((c, i) => (expected[c - cells[0]] = agg === 'count' ? 1 : vs[i]));
          expect(Array.from(inOrder.values)).toEqual(expected);
          expect(Array.from(reversed.values)).toEqual(expected);
          expect(inOrder.start).toBe(t0 + cells[0] * MIN);
        },
      ),
    );
  });
});
