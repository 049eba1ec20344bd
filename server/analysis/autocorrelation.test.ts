import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { crossCorrelation } from './cross-correlation.ts';
import { partialAutocorrelation } from './partial-autocorrelation.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

const finiteSeries = (minLength: number) =>
  fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength, maxLength: 300 }).filter((xs) => Math.max(...xs) - Math.min(...xs) > 1e-6);

describe('autocorrelation', () => {
  it('matches a hand computation of eqs. 2.1.12–2.1.13 (Box, Jenkins & Reinsel)', () => {
    // x = 1,3,2,5,4,6: mean 3.5, Σd² = 17.5, lag-1 products 1.75, lag-2 products 6 (by hand).
    const r = autocorrelation([1, 3, 2, 5, 4, 6], { maxLag: 2 });
    expect(r[0]).toBe(1);
    expect(r[1]).toBeCloseTo(1.75 / 17.5, 15);
    expect(r[2]).toBeCloseTo(6 / 17.5, 15);
    const c = autocorrelation([1, 3, 2, 5, 4, 6], { maxLag: 1, type: 'covariance' });
    expect(c[0]).toBeCloseTo(17.5 / 6, 14);
  });

  it('R na.pass rule: lag k divides by complete pairs + k (checked against R in tests/reference)', () => {
    // x = 1, NaN, 3, 5 (mean 3): lag 1 has one complete pair (3,5) → 0·2/(1+1) = 0;
    // lag 2 has one pair (1,3) → (−2·0)/(1+2) = 0; lag 0: (4+0+4)/3.
    const c = autocorrelation([1, NaN, 3, 5], { maxLag: 3, type: 'covariance' });
    expect(c[0]).toBeCloseTo(8 / 3, 15);
    expect(c[1]).toBe(0);
    expect(c[2]).toBe(0);
    expect(c[3]).toBeCloseTo((-2 * 2) / (1 + 3), 15);
    expect(Number.isNaN(autocorrelation([1, NaN, 3, NaN, 2], { maxLag: 1 })[1])).toBe(true);
  });

  it('property: lag 0 is 1 and every |r_k| ≤ 1', () => {
    fc.assert(
      fc.property(finiteSeries(3), (xs) => {
        const r = autocorrelation(xs, { maxLag: xs.length - 1 });
        expect(r[0]).toBe(1);
        for (const v of r) expect(Math.abs(v)).toBeLessThanOrEqual(1);
      }),
      { numRuns: 200 },
    );
  });

  it('property: the FFT path agrees with the direct sum to 1e-12, with and without gaps', () => {
    fc.assert(
      fc.property(finiteSeries(2), fc.array(fc.nat(), { maxLength: 20 }), (xs, holes) => {
        const x = [...xs];
        for (const h of holes) if (x.length > 2) x[h % x.length] = NaN;
        if (x.filter((v) => !Number.isNaN(v)).length < 2) return;
        const present = x.filter((v) => !Number.isNaN(v));
        if (Math.max(...present) - Math.min(...present) <= 1e-6) return;
        const maxLag = Math.min(x.length - 1, 90);
        const direct = autocorrelation(x, { maxLag, method: 'direct' });
        const viaFft = autocorrelation(x, { maxLag, method: 'fft' });
        for (let k = 0; k <= maxLag; k++) {
          if (Number.isNaN(direct[k])) expect(Number.isNaN(viaFft[k])).toBe(true);
          else expect(Math.abs(direct[k] - viaFft[k])).toBeLessThan(1e-12);
        }
      }),
      { numRuns: 150 },
    );
  });

  it('the FFT path agrees with the direct sum on a long series (n = 200 000, 300 lags)', () => {
    const x = simulateArma({ ar: [0.9] }, 200_000, 5);
    const direct = autocorrelation(x, { maxLag: 300, method: 'direct' });
    const viaFft = autocorrelation(x, { maxLag: 300, method: 'fft' });
    let worst = 0;
    for (let k = 0; k <= 300; k++) worst = Math.max(worst, Math.abs(direct[k] - viaFft[k]));
    expect(worst).toBeLessThan(1e-12);
  });

  it('default maxLag is ⌊10·log10 n⌋ as in R', () => {
    expect(autocorrelation(simulateArma({}, 1000, 1)).length).toBe(31);
    expect(autocorrelation([1, 2, 4]).length).toBe(3); // capped at n − 1
  });

  it('property: pacf at lag 1 equals acf at lag 1 (Durbin–Levinson first step)', () => {
    fc.assert(
      fc.property(finiteSeries(3), (xs) => {
        const r = autocorrelation(xs, { maxLag: 1 });
        const p = partialAutocorrelation(xs, { maxLag: 1 });
        expect(Math.abs(p[0] - r[1])).toBeLessThan(1e-12);
      }),
      { numRuns: 200 },
    );
  });

  it('property: ccf(x, x) equals acf(x) at both signs of the lag', () => {
    fc.assert(
      fc.property(finiteSeries(2), (xs) => {
        const maxLag = Math.min(xs.length - 1, 12);
        const r = autocorrelation(xs, { maxLag });
        const { lags, values } = crossCorrelation(xs, xs, { maxLag });
        for (let i = 0; i < lags.length; i++) expect(Math.abs(values[i] - r[Math.abs(lags[i])])).toBeLessThan(1e-12);
      }),
      { numRuns: 200 },
    );
  });
});
