import { describe, expect, it } from 'vitest';
import { movingAverage } from './moving-average.ts';
import { movingAverageCentred } from './moving-average-centred.ts';

describe('movingAverage', () => {
  it('gives the running mean of each run of span values', () => {
    const out = new Float64Array(4);
    movingAverage(Float64Array.from([1, 2, 3, 4, 5, 10]), 6, 3, out);
    expect(Array.from(out)).toEqual([2, 3, 4, 19 / 3]);
  });
});

describe('movingAverageCentred', () => {
  // Brockwell & Davis (2016) eq. (1.5.12): for even p = 4 the weights are 1/8, 1/4, 1/4, 1/4, 1/8.
  it('even period: the 2×p average with half weights at the ends', () => {
    const x = Float64Array.from([8, 0, 4, 0, 16, 0, 8]);
    const out = movingAverageCentred(x, 4);
    expect(Number.isNaN(out[0]) && Number.isNaN(out[1]) && Number.isNaN(out[5]) && Number.isNaN(out[6])).toBe(true);
    expect(out[2]).toBeCloseTo(8 / 8 + (0 + 4 + 0) / 4 + 16 / 8, 14);
    expect(out[3]).toBeCloseTo(0 / 8 + (4 + 0 + 16) / 4 + 0 / 8, 14);
    expect(out[4]).toBeCloseTo(4 / 8 + (0 + 16 + 0) / 4 + 8 / 8, 14);
  });

  it('odd period: the plain mean of p values', () => {
    const out = movingAverageCentred(Float64Array.from([3, 6, 9, 12, 30]), 3);
    expect(Array.from(out.subarray(1, 4))).toEqual([6, 9, 17]);
  });

  it('is NaN wherever the window holds a missing value, and only there', () => {
    const x = Float64Array.from([1, 2, 3, NaN, 5, 6, 7, 8, 9, 10]);
    const out = movingAverageCentred(x, 3);
    expect(Array.from(out, Number.isNaN)).toEqual([true, false, true, true, true, false, false, false, false, true]);
    expect(out[6]).toBeCloseTo(7, 14);
  });
});
