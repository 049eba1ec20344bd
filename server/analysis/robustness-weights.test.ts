import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { robustnessWeights } from './robustness-weights.ts';

function weightsOf(residuals: number[]): Float64Array {
  const r = Float64Array.from(residuals);
  const out = new Float64Array(r.length);
  robustnessWeights(r, r.length, out, new Float64Array(r.length));
  return out;
}

const bisquare = (u: number) => (u < 1 ? (1 - u * u) ** 2 : 0);

describe('robustnessWeights', () => {
  // Cleveland et al. (1990) §2.3: h = 6·median|r|, weight B(|r|/h) with B(u) = (1 − u²)² for
  // u < 1. Residuals (1, −2, 3, 4, −100): median |r| = 3, h = 18.
  it('odd count: bisquare of |r| / (6 · median)', () => {
    const w = weightsOf([1, -2, 3, 4, -100]);
    const expected = [1, 2, 3, 4, 100].map((r) => bisquare(r / 18));
    for (let i = 0; i < 5; i++) expect(w[i]).toBeCloseTo(expected[i], 15);
    expect(w[4]).toBe(0);
  });

  // Even count: the median is the mean of the two middle values, (2 + 3) / 2, so h = 15.
  it('even count: the median is the mean of the two middle values', () => {
    const w = weightsOf([3, -1, 2, 40]);
    const expected = [3, 1, 2, 40].map((r) => bisquare(r / 15));
    for (let i = 0; i < 4; i++) expect(w[i]).toBeCloseTo(expected[i], 15);
  });

  // The reference code's cut-offs (stl.f, stlrwt): weight 1 within 0.001·h, 0 beyond 0.999·h.
  it('applies the 0.001 and 0.999 cut-offs of the reference code', () => {
    // median |r| = 1, h = 6: 0.005 ≤ 0.006 gets exactly 1; 5.9999 > 5.994 gets exactly 0.
    const w = weightsOf([0.005, 1, 1, 1, 5.9999]);
    expect(w[0]).toBe(1);
    expect(w[4]).toBe(0);
  });

  it('uses the exact median: agrees with a sorted median on any data', () => {
    fc.assert(
      // Subnormal residuals are left out: there the scale itself has only a few bits.
      fc.property(
        fc.array(
          fc.double({ min: -1e6, max: 1e6, noNaN: true }).filter((v) => v === 0 || Math.abs(v) > 1e-300),
          { minLength: 1, maxLength: 300 },
        ),
        (residuals) => {
          const sorted = residuals.map(Math.abs).sort((a, b) => a - b);
          const m = sorted.length;
          const median = m % 2 ? sorted[m >> 1] : (sorted[m / 2 - 1] + sorted[m / 2]) / 2;
          const h = 6 * median;
          const w = weightsOf(residuals);
          residuals.forEach((r, i) => {
            const u = Math.abs(r) / h;
            // Away from the cut-offs the weight is the plain bisquare.
            if (u > 0.0011 && u < 0.9989) expect(Math.abs(w[i] - bisquare(u))).toBeLessThan(1e-12);
            if (u > 0.9991) expect(w[i]).toBe(0);
          });
        },
      ),
      { numRuns: 200 },
    );
  });
});
