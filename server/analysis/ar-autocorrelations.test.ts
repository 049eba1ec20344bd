import { describe, expect, it } from 'vitest';
import { arAutocorrelations } from './ar-autocorrelations.ts';

describe('arAutocorrelations', () => {
  it("continues an AR(2) as R's ARMAacf(ar = c(0.5, 0.3), lag.max = 8) (R 4.2.2)", () => {
    const expected = [
      1, 0.7142857142857143, 0.65714285714285714, 0.54285714285714282, 0.46857142857142853, 0.39714285714285713, 0.33914285714285708, 0.2887142857142857,
      0.24609999999999999,
    ];
    const rho = arAutocorrelations([0.5, 0.3], [expected[1], expected[2]], 8);
    expected.forEach((v, h) => expect(rho[h]).toBeCloseTo(v, 12));
  });

  it('gives φ^h for an AR(1) and zero beyond lag 0 for white noise', () => {
    const rho = arAutocorrelations([0.8], [0.8], 50);
    for (const h of [0, 1, 7, 50]) expect(rho[h]).toBeCloseTo(0.8 ** h, 12);
    expect(Array.from(arAutocorrelations([], [], 3))).toEqual([1, 0, 0, 0]);
  });
});
