import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { rangeSlices } from './channel-readings.repo.ts';

describe('rangeSlices', () => {
  it('keeps a range shorter than two slices whole', () => {
    expect(rangeSlices(0, 99_999 * 60_000, 60_000, 50_000, 4)).toEqual([[0, 99_999 * 60_000]]);
  });

  it('cuts 100,000 one-minute steps in two at a whole minute', () => {
    const from = Date.UTC(2025, 0, 31);
    expect(rangeSlices(from, from + 100_000 * 60_000, 60_000, 50_000, 4)).toEqual([
      [from, from + 50_000 * 60_000],
      [from + 50_000 * 60_000, from + 100_000 * 60_000],
    ]);
  });

  it('tiles the range in order, at most maxSlices, inner cuts on whole steps since the epoch', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 ** 40 }),
        fc.integer({ min: 1, max: 5_000 }),
        fc.integer({ min: 1, max: 10 ** 6 }),
        fc.integer({ min: 1, max: 600 }),
        fc.integer({ min: 1, max: 6 }),
        (from, steps, stepMs, sliceSteps, maxSlices) => {
          const to = from + steps * stepMs - Math.min(from % 7, steps * stepMs - 1); // ends need not be on the grid
          const slices = rangeSlices(from, to, stepMs, sliceSteps, maxSlices);
          expect(slices.length).toBeGreaterThanOrEqual(1);
          expect(slices.length).toBeLessThanOrEqual(maxSlices);
          expect(slices[0][0]).toBe(from);
          expect(slices[slices.length - 1][1]).toBe(to);
          for (let i = 0; i < slices.length; i++) {
            expect(slices[i][0]).toBeLessThan(slices[i][1]);
            if (i > 0) {
              expect(slices[i][0]).toBe(slices[i - 1][1]);
              expect(slices[i][0] % stepMs).toBe(0);
            }
          }
        },
      ),
    );
  });
});
