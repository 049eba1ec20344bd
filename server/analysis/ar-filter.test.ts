import { describe, expect, it } from 'vitest';
import { arFilter } from './ar-filter.ts';

describe('arFilter', () => {
  it('e_t = (x_t − μ) − φ1 (x_{t−1} − μ) − φ2 (x_{t−2} − μ), first p missing (by hand)', () => {
    const out = arFilter([1, 4, 2, 8, 5], [0.5, -0.25], 2);
    expect(Number.isNaN(out[0]) && Number.isNaN(out[1])).toBe(true);
    // t = 2: 0 − 0.5·2 + 0.25·(−1) = −1.25; t = 3: 6 − 0 + 0.25·2 = 6.5; t = 4: 3 − 3 − 0 = 0
    expect(Array.from(out.subarray(2))).toEqual([-1.25, 6.5, 0]);
  });
  it('a missing reading spoils the p + 1 outputs that use it; order 0 is the demeaned series', () => {
    const out = arFilter([1, NaN, 2, 3, 4], [0.5], 0);
    expect(Array.from(out, Number.isNaN)).toEqual([true, true, true, false, false]);
    expect(Array.from(arFilter([1, 2, 3], [], 2))).toEqual([-1, 0, 1]);
  });
});
