import { describe, expect, it } from 'vitest';
import { medianInPlace } from './median-in-place.ts';

// R 4.2.2: median(lh) = 2.3 (48 values), median(lh[-1]) = 2.3 (47 values), median(c(5, 5, 5, 1)) = 5.
const LH = [
  2.4, 2.4, 2.4, 2.2, 2.1, 1.5, 2.3, 2.3, 2.5, 2, 1.9, 1.7, 2.2, 1.8, 3.2, 3.2, 2.7, 2.2, 2.2, 1.9, 1.9, 1.8, 2.7, 3, 2.3, 2, 2, 2.9, 2.9, 2.7, 2.7, 2.3, 2.6,
  2.4, 1.8, 1.7, 1.5, 1.4, 2.1, 3.3, 3.5, 3.5, 3.1, 2.6, 2.1, 3.4, 3, 2.9,
];

describe('medianInPlace', () => {
  it("matches R's median for an even and an odd count, and with ties", () => {
    expect(medianInPlace(Float64Array.from(LH), 48)).toBe(2.3);
    expect(medianInPlace(Float64Array.from(LH.slice(1)), 47)).toBe(2.3);
    expect(medianInPlace(Float64Array.from([5, 5, 5, 1]), 4)).toBe(5);
  });

  it('equals the sorted middle values on many random arrays with ties, and only looks at the first n', () => {
    let seed = 99;
    const next = () => {
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      return seed / 2 ** 32;
    };
    for (let trial = 0; trial < 2000; trial++) {
      const n = 1 + Math.floor(next() * 30);
      const values = Array.from({ length: n }, () => Math.floor(next() * 7) - 3);
      const sorted = [...values].sort((a, b) => a - b);
      const h = n >> 1;
      const expected = n % 2 ? sorted[h] : (sorted[h - 1] + sorted[h]) / 2;
      expect(medianInPlace(Float64Array.from([...values, 1e9, -1e9]), n)).toBe(expected);
    }
    expect(medianInPlace(new Float64Array(3), 0)).toBeNaN();
  });
});
