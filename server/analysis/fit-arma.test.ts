import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { armaArToPacf } from './arma-ar-to-pacf.ts';
import { armaSmallestRoot } from './arma-smallest-root.ts';
import { fitArma } from './fit-arma.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

// datasets::lh (R 4.2.2), 48 values.
const LH = [
  2.4, 2.4, 2.4, 2.2, 2.1, 1.5, 2.3, 2.3, 2.5, 2, 1.9, 1.7, 2.2, 1.8, 3.2, 3.2, 2.7, 2.2, 2.2, 1.9, 1.9, 1.8, 2.7, 3, 2.3, 2, 2, 2.9, 2.9, 2.7, 2.7, 2.3, 2.6,
  2.4, 1.8, 1.7, 1.5, 1.4, 2.1, 3.3, 3.5, 3.5, 3.1, 2.6, 2.1, 3.4, 3, 2.9,
];

describe('fitArma', () => {
  it('matches R\'s arima(lh, order = c(1, 0, 0), method = "ML") (R 4.2.2)', () => {
    // R: coef ar1 0.57394, intercept 2.41326; s.e. 0.11614, 0.14662; sigma2 0.1974895; loglik -29.379162.
    const fit = fitArma(LH, { p: 1, q: 0 });
    expect(fit.logLik).toBeCloseTo(-29.379162, 4);
    expect(fit.ar[0]).toBeCloseTo(0.57394, 3);
    expect(fit.mean!).toBeCloseTo(2.41326, 3);
    expect(fit.standardErrors.ar[0]).toBeCloseTo(0.11614, 3);
    expect(fit.standardErrors.mean!).toBeCloseTo(0.14662, 3);
    expect(fit.sigma2).toBeCloseTo(0.1974895, 5);
    // AIC as R (k = 3: φ, μ, σ²): -2·loglik + 6 = 64.758324.
    expect(fit.aic).toBeCloseTo(64.758324, 3);
    expect(fit.aicc).toBeCloseTo(fit.aic + (2 * 3 * 4) / (48 - 3 - 1), 10);
    expect(fit.bic).toBeCloseTo(-2 * fit.logLik + 3 * Math.log(48), 10);
    expect(fit.residuals).toHaveLength(48);
    expect(fit.converged).toBe(true);
  });

  it('fits ARMA(0, 0): the mean and variance of the values, σ² with divisor n', () => {
    const fit = fitArma(LH, { p: 0, q: 0 });
    const mean = LH.reduce((a, b) => a + b, 0) / LH.length;
    const variance = LH.reduce((a, b) => a + (b - mean) ** 2, 0) / LH.length;
    expect(fit.mean!).toBeCloseTo(mean, 6);
    expect(fit.sigma2).toBeCloseTo(variance, 8);
    // Gaussian log-likelihood of iid N(mean, variance): −n/2 (ln 2πσ² + 1) (common practice).
    expect(fit.logLik).toBeCloseTo((-LH.length / 2) * (Math.log(2 * Math.PI * variance) + 1), 8);
    // SE of the mean of iid values: σ/√n.
    expect(fit.standardErrors.mean!).toBeCloseTo(Math.sqrt(variance / LH.length), 4);
  });

  it('fits without a mean when asked: mean and its SE are null, k counts one parameter less', () => {
    const x = simulateArma({ ar: [0.5] }, 200, 11);
    const fit = fitArma(x, { p: 1, q: 0, includeMean: false });
    expect(fit.mean).toBeNull();
    expect(fit.standardErrors.mean).toBeNull();
    expect(fit.aic).toBeCloseTo(-2 * fit.logLik + 4, 10);
  });

  it('skips missing values in the Kalman filter (NaN residual there) and counts only present values', () => {
    const x = Array.from(simulateArma({ ar: [0.7] }, 300, 5));
    const full = fitArma(x, { p: 1, q: 0 });
    x[100] = NaN;
    x[101] = NaN;
    const gappy = fitArma(x, { p: 1, q: 0 });
    expect(Number.isNaN(gappy.residuals[100])).toBe(true);
    expect(Number.isFinite(gappy.residuals[102])).toBe(true);
    expect(Math.abs(gappy.ar[0] - full.ar[0])).toBeLessThan(0.05);
    expect(gappy.bic - -2 * gappy.logLik).toBeCloseTo(3 * Math.log(298), 10);
  });

  it('fits through every-other-value gaps, where the CSS start is undefined, from the zero start', () => {
    // Observed at even steps only, an AR(1) identifies φ² (lag-2 correlation), so |φ̂| is checked.
    const x = Array.from(simulateArma({ ar: [0.8] }, 400, 21), (v, i) => (i % 2 ? NaN : v));
    const fit = fitArma(x, { p: 1, q: 0 });
    expect(fit.converged).toBe(true);
    expect(Math.abs(Math.abs(fit.ar[0]) - 0.8)).toBeLessThan(0.1);
    expect(fit.aic).toBeCloseTo(-2 * fit.logLik + 6, 10);
  });

  it('also starts from given points, padding them to (p, q) and skipping non-stationary ones', () => {
    const x = simulateArma({ ar: [0.5, 0.2], ma: [0.4] }, 300, 5);
    const plain = fitArma(x, { p: 3, q: 3 });
    const nested = fitArma(x, { p: 3, q: 2 });
    const warm = fitArma(x, { p: 3, q: 3, starts: [nested, { ar: [1.5, 0.2], ma: [] }] });
    // Without the nested start this ARMA(3,3) fit ends 1.2 below ARMA(3,2) (seen while writing this test).
    expect(plain.logLik).toBeLessThan(nested.logLik - 1);
    expect(warm.logLik).toBeGreaterThanOrEqual(nested.logLik - 1e-6);
    expect(() => fitArma(x, { p: 1, q: 0, starts: [{ ar: [0.5] }] as never })).toThrow('fitArma: starts must be a list of { ar, ma } coefficient arrays');
    expect(() => fitArma(x, { p: 1, q: 0, starts: 'x' as never })).toThrow('fitArma: starts must be a list of { ar, ma } coefficient arrays');
  });

  it('does not mutate its input', () => {
    const x = Object.freeze(Array.from(simulateArma({ ma: [0.4] }, 120, 3)));
    const copy = [...x];
    fitArma(x, { p: 1, q: 1 });
    expect(x).toEqual(copy);
    const typed = simulateArma({ ma: [0.4] }, 120, 3);
    const typedCopy = typed.slice();
    fitArma(typed, { p: 0, q: 1 });
    expect(typed).toEqual(typedCopy);
  });

  it('refuses bad input with messages that say what to do', () => {
    const x = Array.from(simulateArma({ ar: [0.3] }, 100, 1));
    expect(() => fitArma(x.slice(0, 15), { p: 2, q: 1 })).toThrow(AnalysisInputError);
    expect(() => fitArma(x.slice(0, 15), { p: 2, q: 1 })).toThrow(
      'fitArma needs at least 22 points for ARMA(2,1) (got 15): choose a longer range or a lower order',
    );
    const gappy = x.slice(0, 22).map((v, i) => (i < 5 ? NaN : v));
    expect(() => fitArma(gappy, { p: 2, q: 1 })).toThrow('fitArma needs at least 22 points for ARMA(2,1) (got 17)');
    expect(() => fitArma(new Array(40).fill(3), { p: 1, q: 0 })).toThrow(
      'fitArma: the series is constant (every value is 3), so no ARMA model can be fitted: choose a range where the readings vary',
    );
    expect(() => fitArma(x, { p: 6, q: 0 })).toThrow('fitArma: p must be a whole number from 0 to 5 (got 6)');
    expect(() => fitArma(x, { p: 1.5, q: 0 })).toThrow('fitArma: p must be a whole number from 0 to 5 (got 1.5)');
    expect(() => fitArma(x, { p: 1, q: -1 })).toThrow('fitArma: q must be a whole number from 0 to 5 (got -1)');
    expect(() => fitArma(x, { p: 1 } as never)).toThrow('fitArma: q must be a whole number from 0 to 5 (got undefined)');
    expect(() => fitArma(x, undefined as never)).toThrow('fitArma: options { p, q } are required');
    expect(() => fitArma(x, { p: 1, q: 0, includeMean: 'yes' as never })).toThrow('fitArma: includeMean must be true or false (got yes)');
    expect(() => fitArma([...x.slice(0, 50), Infinity], { p: 1, q: 0 })).toThrow(
      'fitArma: the series holds an infinite value at index 50: remove it or mark it missing (NaN)',
    );
    expect(() => fitArma(null as never, { p: 1, q: 0 })).toThrow('fitArma: the series must be an array of numbers');
    expect(() => fitArma('1234567890123456789012345' as never, { p: 1, q: 0 })).toThrow('fitArma: the series must be an array of numbers');
  });

  it('returns only stationary and invertible models (property over seeded ARMA series and orders)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 0, max: 3 }),
        fc.double({ min: -0.9, max: 0.9, noNaN: true }),
        fc.double({ min: -0.9, max: 0.9, noNaN: true }),
        fc.integer({ min: 1, max: 1_000_000 }),
        (p, q, phi, theta, seed) => {
          const x = simulateArma({ ar: [phi], ma: [theta] }, 150, seed);
          const fit = fitArma(x, { p, q });
          expect(armaArToPacf(fit.ar)).not.toBeNull();
          expect(armaSmallestRoot([], fit.ma)).toBeGreaterThanOrEqual(1 - 1e-9);
          expect(Number.isFinite(fit.logLik)).toBe(true);
          expect(fit.sigma2).toBeGreaterThan(0);
        },
      ),
      { numRuns: 40, seed: 1616 },
    );
  });

  it('covers the true AR(1) coefficient with φ̂ ± 1.96·SE in about 95 % of 200 seeded series (n = 500)', () => {
    const draws = fc.sample(fc.tuple(fc.double({ min: -0.9, max: 0.9, noNaN: true }), fc.integer({ min: 1, max: 2 ** 31 - 1 })), {
      numRuns: 200,
      seed: 42,
    });
    let covered = 0;
    for (const [phi, seed] of draws) {
      const fit = fitArma(simulateArma({ ar: [phi] }, 500, seed), { p: 1, q: 0 });
      if (Math.abs(fit.ar[0] - phi) <= 1.96 * fit.standardErrors.ar[0]) covered++;
    }
    expect(covered / draws.length).toBeGreaterThanOrEqual(0.9);
    expect(covered / draws.length).toBeLessThanOrEqual(0.99);
  });
});
