import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loessEstimate } from './loess-estimate.ts';
import { loessSmooth } from './loess-smooth.ts';

function smooth(y: number[], span: number, degree: number, jump: number, weights?: number[]): Float64Array {
  const out = new Float64Array(y.length);
  loessSmooth(Float64Array.from(y), y.length, span, degree, jump, weights ? Float64Array.from(weights) : null, out, 0);
  return out;
}

const smoothing = fc.record({
  n: fc.integer({ min: 2, max: 80 }),
  span: fc.integer({ min: 3, max: 41 }),
  jump: fc.integer({ min: 1, max: 12 }),
  a: fc.double({ min: -100, max: 100, noNaN: true }),
  b: fc.double({ min: -10, max: 10, noNaN: true }),
  robust: fc.boolean(),
});

describe('loessSmooth', () => {
  // Local linear regression reproduces straight lines exactly (Cleveland 1979, §2: the fit
  // is a weighted least-squares line), at fitted and interpolated positions alike, with or
  // without extra weights, and whether the window is centred, at an end or the whole series.
  it('degree 1 reproduces a straight line', () => {
    fc.assert(
      fc.property(smoothing, ({ n, span, jump, a, b, robust }) => {
        const y = Array.from({ length: n }, (_, i) => a + b * i);
        const w = robust ? Array.from({ length: n }, (_, i) => 0.2 + ((i * 37) % 10) / 10) : undefined;
        const out = smooth(y, span, 1, jump, w);
        for (let i = 0; i < n; i++) expect(Math.abs(out[i] - y[i])).toBeLessThan(1e-9 * (1 + Math.abs(a) + Math.abs(b) * n));
      }),
      { numRuns: 200 },
    );
  });

  it('degree 0 reproduces a constant', () => {
    fc.assert(
      fc.property(smoothing, ({ n, span, jump, a, robust }) => {
        const y = new Array(n).fill(a);
        const w = robust ? Array.from({ length: n }, (_, i) => 0.5 + (i % 3) / 4) : undefined;
        const out = smooth(y, span, 0, jump, w);
        for (let i = 0; i < n; i++) expect(Math.abs(out[i] - a)).toBeLessThan(1e-12 * (1 + Math.abs(a)));
      }),
      { numRuns: 200 },
    );
  });

  // A worked value: span 5 at the centre of 0..4, degree 0. Radius h = 2; distances 2 get no
  // weight (beyond 0.999 h); distance 1 gets (1 − (1/2)³)³ = (7/8)³; distance 0 gets 1.
  it('uses tricube weights over the neighbourhood radius', () => {
    const y = [10, 1, 2, 3, 20];
    const w1 = (7 / 8) ** 3;
    const expected = (2 + w1 * (1 + 3)) / (1 + 2 * w1);
    expect(loessEstimate(Float64Array.from(y), 5, 5, 0, 2, 0, 4, null)).toBeCloseTo(expected, 14);
    expect(smooth(y, 5, 0, 1)[2]).toBeCloseTo(expected, 14);
  });

  it('keeps the input value where every weight is zero', () => {
    const y = [1, 2, 3, 4, 5, 6, 7];
    const out = smooth(y, 3, 1, 1, [0, 0, 0, 0, 0, 0, 0]);
    expect(Array.from(out)).toEqual(y);
  });
});
