/**
 * Lagbook's ARMA forecasts (forecastArma) against R 4.2.2 `predict(arima(x, order, method =
 * "ML"), n.ahead = 24)` on datasets that ship with R (lh, LakeHuron, Nile, log10(lynx),
 * presidents — which has missing quarters) and a seeded `arima.sim` ARMA(2,1). The fixture
 * (series, exact calls, R's coefficients and σ², its forecasts and standard errors, R version)
 * is written by forecast.R in this folder.
 *
 * The chance of crossing a limit within a horizon (armaCrossingChance) is checked against R's own
 * simulated future paths (forecast 8.20 `simulate(fit, nsim = h, future = TRUE)`, 20,000 each)
 * and, at one step, against the exact normal tail (`pnorm`).
 *
 * Two checks of the forecasts: the recursion on R's own parameters (forecasts and standard errors to 1e-12
 * relative; measured ≤ 8.2e-16 when written), and the whole path as the product runs it — our
 * own fit (fitArma) then our forecast — against R's forecasts, to the accuracy the two fits
 * agree (measured when written: forecasts within 1.0e-4 of R's one-step standard error, standard
 * errors within 3.7e-5 relative, over the ten cases and 24 steps).
 */
import { describe, expect, it } from 'vitest';
import { armaCrossingChance, fitArma, forecastArma } from '../../server/analysis/index.ts';
import { loadReferenceFixture } from './reference-fixture.ts';

const R = loadReferenceFixture('forecast-r.json');
const seriesOf = (name: string): number[] => R.series[name].map((v: number | null) => (v === null ? NaN : v));
const one = (v: number[] | number): number => (Array.isArray(v) ? v[0] : v);
const H = one(R.horizon);

describe('fixture provenance', () => {
  it('names R 4.2.2, the script and every call', () => {
    expect(R.generator.tool).toMatch(/^R version 4\.2\.2/);
    expect(R.generator.script).toBe('tests/reference/forecast.R');
    expect(R.cases).toHaveLength(10);
    for (const c of R.cases) expect(c.call).toBe(`predict(arima(x, order = c(${one(c.p)}, 0, ${one(c.q)}), method = "ML"), n.ahead = 24)`);
    // presidents has missing quarters: the filter must pass them by prediction alone.
    expect(seriesOf('presidents').filter(Number.isNaN).length).toBeGreaterThan(0);
  });
});

describe('forecastArma on R’s own parameters', () => {
  for (const c of R.cases) {
    it(`${c.series} ARMA(${one(c.p)},${one(c.q)}): forecasts and standard errors 1…${H} steps ahead match R to 1e-12 relative`, () => {
      const model = { ar: c.ar as number[], ma: c.ma as number[], mean: one(c.mean), sigma2: one(c.sigma2) };
      const ours = forecastArma(seriesOf(c.series), model, H);
      for (let k = 0; k < H; k++) {
        expect(Math.abs(ours.mean[k] - c.pred[k]) / Math.abs(c.pred[k])).toBeLessThan(1e-12);
        expect(Math.abs(ours.se[k] - c.se[k]) / c.se[k]).toBeLessThan(1e-12);
      }
    });
  }
});

describe('fitArma then forecastArma, against R’s fit and forecast', () => {
  // The two optimisers stop at slightly different points of the same likelihood; the forecasts
  // inherit that difference: within 5e-4 of R's one-step standard error, and 2e-4 relative for
  // the standard errors.
  for (const c of R.cases.filter((k: { optimCode: number[] }) => one(k.optimCode) === 0)) {
    it(`${c.series} ARMA(${one(c.p)},${one(c.q)})`, () => {
      const x = seriesOf(c.series);
      const fit = fitArma(x, { p: one(c.p), q: one(c.q) });
      const ours = forecastArma(x, { ar: fit.ar, ma: fit.ma, mean: fit.mean!, sigma2: fit.sigma2 }, H);
      for (let k = 0; k < H; k++) {
        expect(Math.abs(ours.mean[k] - c.pred[k]) / c.se[0]).toBeLessThan(5e-4);
        expect(Math.abs(ours.se[k] - c.se[k]) / c.se[k]).toBeLessThan(2e-4);
      }
    });
  }
});

describe('armaCrossingChance against R’s simulated future paths (forecast 8.20 simulate.Arima, future = TRUE)', () => {
  // R's share is from 20,000 paths, ours from 20,000 (seed 1); both are Monte Carlo estimates, so
  // they must agree within 4 combined standard errors (common practice for a simulation check).
  // AR models only: R conditions their paths on the last p values, exactly as the filter does.
  for (const c of R.crossings) {
    it(`${c.series} AR(${one(c.p)}): chance of passing ${c.side === 'above' ? 'above' : 'below'} ${one(c.limit)} within ${one(c.steps)} steps`, () => {
      const model = { ar: c.ar as number[], ma: [], mean: one(c.mean), sigma2: one(c.sigma2) };
      const ours = armaCrossingChance(seriesOf(c.series), model, { limit: one(c.limit), side: c.side, steps: one(c.steps), draws: 20_000 });
      const theirs = one(c.chance);
      const se = Math.sqrt((theirs * (1 - theirs)) / one(c.draws) + ours.standardError ** 2);
      expect(Math.abs(ours.chance - theirs)).toBeLessThan(4 * se);
      // The chance within the horizon is never below the exact chance of crossing at its first step (R's pnorm of the one-step forecast).
      expect(ours.chance).toBeGreaterThanOrEqual(one(c.oneStepExact) - 4 * ours.standardError);
    });
  }

  it('one step ahead equals the normal tail of the one-step forecast (R pnorm), within Monte Carlo error', () => {
    const c = R.crossings.find((k: { steps: number[] }) => one(k.steps) === 1);
    const model = { ar: c.ar as number[], ma: [], mean: one(c.mean), sigma2: one(c.sigma2) };
    const ours = armaCrossingChance(seriesOf(c.series), model, { limit: one(c.limit), side: c.side, steps: 1, draws: 200_000 });
    expect(Math.abs(ours.chance - one(c.oneStepExact))).toBeLessThan(4 * ours.standardError);
    expect(ours.medianFirstStep).toBe(1);
  });

  it('is repeatable for a seed, and refuses a horizon, side or number of paths it cannot use', () => {
    const x = seriesOf('lh');
    const model = { ar: [0.5], ma: [], mean: 2.4, sigma2: 0.2 };
    const options = { limit: 3, side: 'above' as const, steps: 5 };
    expect(armaCrossingChance(x, model, options)).toEqual(armaCrossingChance(x, model, options));
    expect(() => armaCrossingChance(x, model, { ...options, steps: 0 })).toThrow('armaCrossingChance: steps must be a whole number from 1 to 10000 (got 0)');
    expect(() => armaCrossingChance(x, model, { ...options, draws: 10 })).toThrow('draws must be a whole number from 500 to 200000');
    expect(() => armaCrossingChance(x, model, { ...options, side: 'sideways' as 'above' })).toThrow("side must be 'above' or 'below'");
  });
});

describe('forecastArma', () => {
  it('returns to the mean and to the series’ own spread far ahead (a stationary AR(1), worked by hand)', () => {
    // AR(1) φ = 0.5, μ = 10, σ² = 1: k-step forecast μ + φ^k (x_n − μ), variance σ²(1 − φ^{2k})/(1 − φ²)
    // (Brockwell & Davis, Introduction to Time Series and Forecasting, 2nd ed., §3.3, example).
    const f = forecastArma([10, 11, 12], { ar: [0.5], ma: [], mean: 10, sigma2: 1 }, 40);
    for (const k of [1, 2, 5]) {
      expect(f.mean[k - 1]).toBeCloseTo(10 + 0.5 ** k * 2, 12);
      expect(f.se[k - 1] ** 2).toBeCloseTo((1 - 0.25 ** k) / 0.75, 12);
    }
    expect(f.mean[39]).toBeCloseTo(10, 10);
    expect(f.se[39]).toBeCloseTo(Math.sqrt(4 / 3), 10);
  });

  it('refuses a horizon that is not a whole number of steps and a model that is not stationary', () => {
    expect(() => forecastArma([1, 2, 3], { ar: [0.5], ma: [], mean: 0, sigma2: 1 }, 0)).toThrow(
      'forecastArma: h must be a whole number of steps, at least 1 (got 0)',
    );
    expect(() => forecastArma([1, 2, 3], { ar: [1], ma: [], mean: 0, sigma2: 1 }, 3)).toThrow('root on the unit circle');
  });
});
