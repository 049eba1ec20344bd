import { describe, expect, it } from 'vitest';
import { chiSquareUpperTail } from './chi-square-upper-tail.ts';

describe('chiSquareUpperTail', () => {
  it('reproduces the 5% points of the chi-square table (common practice; values from memory, 4–5 decimals)', () => {
    expect(chiSquareUpperTail(3.841459, 1)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(18.307038, 10)).toBeCloseTo(0.05, 6);
    expect(chiSquareUpperTail(31.410433, 20)).toBeCloseTo(0.05, 6);
  });

  it('equals the closed forms Q = e^{−q/2} Σ_{k<ν/2} (q/2)^k / k! for even ν (Abramowitz & Stegun 26.4.21)', () => {
    for (const df of [2, 4, 10, 40]) {
      for (const q of [0.3, 5, 30, 120]) {
        let term = 1;
        let sum = 1;
        for (let k = 1; k < df / 2; k++) {
          term *= q / 2 / k;
          sum += term;
        }
        const exact = Math.exp(-q / 2) * sum;
        expect(Math.abs(chiSquareUpperTail(q, df) - exact) / exact).toBeLessThan(1e-13);
      }
    }
  });

  it('keeps relative accuracy far in the tail where 1 − CDF would round to 0', () => {
    expect(1 - (1 - chiSquareUpperTail(200, 2))).toBe(0); // what 1 − CDF would report
    expect(Math.abs(chiSquareUpperTail(200, 2) / Math.exp(-100) - 1)).toBeLessThan(1e-13);
  });

  it('rejects non-integer degrees of freedom', () => {
    expect(() => chiSquareUpperTail(1, 1.5)).toThrow('chi-square tail: degrees of freedom must be a whole number ≥ 1 (got 1.5)');
  });
});
