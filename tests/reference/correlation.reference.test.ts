/**
 * Lagbook's correlation engine against R 4.2.2 `stats` and statsmodels 0.13.5 on datasets that
 * ship with R. The fixtures (series, exact calls, versions) are written by correlation.R and
 * correlation.py in this folder; see README.md to regenerate them.
 */
import { describe, expect, it } from 'vitest';
import { acf, acfBands, adf, arYuleWalker, boxPierce, ccf, difference, ljungBox, pacf } from '../../server/analysis/index.ts';
import { loadReferenceFixture, type ReferenceJson as Json } from './reference-fixture.ts';

const load = loadReferenceFixture;
const R = load('correlation-r.json');
const SM = load('correlation-statsmodels.json');

/** R's NA is stored as null; the engine's missing value is NaN. */
const seriesOf = (doc: Json, name: string): number[] => doc.series[name].map((v: number | null) => (v === null ? NaN : v));
/** correlation.R stores scalars as one-element arrays. */
const one = (v: number[] | number): number => (Array.isArray(v) ? v[0] : v);

function expectAllClose(actual: ArrayLike<number>, expected: ArrayLike<number | null>, absTol: number, relTol = 0): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i];
    if (e === null || Number.isNaN(e)) {
      expect(Number.isNaN(actual[i]), `index ${i}: expected missing`).toBe(true);
      continue;
    }
    const tol = absTol + relTol * Math.abs(e);
    expect(Math.abs(actual[i] - e), `index ${i}: ${actual[i]} vs ${e}`).toBeLessThanOrEqual(tol);
  }
}

describe('fixtures record their provenance', () => {
  it('names the R and statsmodels versions and the scripts', () => {
    expect(R.generator.tool).toMatch(/^R version 4\.2\.2/);
    expect(SM.generator.tool).toMatch(/^statsmodels 0\.13\.5/);
    expect(R.series.presidents.filter((v: number | null) => v === null).length).toBe(6); // presidents has 6 NAs
  });
});

describe('acf against R stats::acf (tolerance 1e-10)', () => {
  for (const c of R.acf) {
    for (const method of ['auto', 'direct', 'fft'] as const) {
      it(`${c.call} [${method}]`, () => {
        const values = acf(seriesOf(R, c.series), { maxLag: one(c.maxLag), type: c.type, demean: c.demean, method });
        expectAllClose(values, c.values, 1e-10, 1e-10);
      });
    }
  }
  for (const c of R.acfDefaultLag) {
    it(`default maxLag as ${c.call}`, () => {
      expect(acf(seriesOf(R, c.series)).length - 1).toBe(one(c.maxLag));
    });
  }
});

describe('pacf against R stats::pacf (tolerance 1e-10)', () => {
  for (const c of R.pacf) {
    it(c.call, () => {
      expectAllClose(pacf(seriesOf(R, c.series), { maxLag: one(c.maxLag) }), c.values, 1e-10);
    });
  }
});

describe('acfBands against the band code of R stats:::plot.acf (tolerance 1e-12)', () => {
  for (const c of R.bands) {
    it(c.call, () => {
      const r = acf(seriesOf(R, c.series), { maxLag: one(c.maxLag) });
      const alpha = one(c.alpha);
      const white = acfBands(r, { n: one(c.n), alpha, kind: 'white-noise' });
      const bartlett = acfBands(r, { n: one(c.n), alpha, kind: 'bartlett' });
      expectAllClose(white.limits, new Array(one(c.maxLag)).fill(one(c.white)), 1e-12);
      expectAllClose(bartlett.limits, c.bartlett, 1e-12);
      expect(Array.from(bartlett.lags)).toEqual(Array.from({ length: one(c.maxLag) }, (_, i) => i + 1));
      // The series form gives the same band as the ACF form.
      expectAllClose(acfBands(seriesOf(R, c.series), { maxLag: one(c.maxLag), alpha, kind: 'bartlett' }).limits, c.bartlett, 1e-12);
    });
  }
});

describe('ljungBox / boxPierce against R stats::Box.test (relative 1e-10)', () => {
  for (const c of R.box) {
    it(c.call, () => {
      const test = c.type === 'Ljung-Box' ? ljungBox : boxPierce;
      const result = test(seriesOf(R, c.series), { lag: one(c.lag), fitdf: one(c.fitdf) });
      expect(result.df).toBe(one(c.df));
      expectAllClose([result.statistic], [one(c.statistic)], 0, 1e-10);
      // Ours is the exact upper tail; R's Box.test prints 1 − pchisq (equal to ~1e-16 absolute).
      expectAllClose([result.pValue], [one(c.pValueUpperTail)], 1e-300, 1e-10);
      expectAllClose([result.pValue], [one(c.pValue)], 1e-15, 1e-10);
    });
  }
});

describe('ccf against R stats::ccf (tolerance 1e-10)', () => {
  for (const c of R.ccf) {
    it(c.call, () => {
      const result = ccf(seriesOf(R, c.x), seriesOf(R, c.y), { maxLag: one(c.maxLag) });
      expect(Array.from(result.lags)).toEqual(c.lags);
      expectAllClose(result.values, c.values, 1e-10);
    });
  }
  it(`default maxLag as ${R.ccfDefaultLag.call}`, () => {
    expect(ccf(seriesOf(R, 'mdeaths'), seriesOf(R, 'fdeaths')).lags[0]).toBe(-one(R.ccfDefaultLag.maxLag));
  });
});

describe('arYuleWalker against R stats::ar.yw (coefficients 1e-8)', () => {
  for (const c of R.ar) {
    it(c.call, () => {
      const fit = arYuleWalker(seriesOf(R, c.series), c.maxOrder === null ? {} : { maxOrder: one(c.maxOrder) });
      expect(fit.order).toBe(one(c.order));
      expect(fit.aic.length - 1).toBe(one(c.orderMax));
      expectAllClose(fit.coefficients, c.coefficients, 1e-8);
      expectAllClose([fit.variance], [one(c.variance)], 0, 1e-8);
      expectAllClose(fit.aic, c.aic, 1e-8);
      expectAllClose([fit.mean], [one(c.mean)], 1e-12, 1e-12);
    });
  }
  it(R.arFixedOrder.call, () => {
    const fit = arYuleWalker(seriesOf(R, 'lh'), { maxOrder: 3, aic: false });
    expect(fit.order).toBe(3);
    expectAllClose(fit.coefficients, R.arFixedOrder.coefficients, 1e-8);
    expectAllClose([fit.variance], [one(R.arFixedOrder.variance)], 0, 1e-8);
  });
});

describe('difference against R base::diff (exact to rounding)', () => {
  for (const c of R.diff) {
    it(c.call, () => {
      const values = difference(seriesOf(R, c.series), { lag: one(c.lag), order: one(c.differences) });
      expectAllClose(values, c.values, 1e-9, 1e-15);
    });
  }
});

describe('statsmodels 0.13.5 cross-checks', () => {
  for (const c of SM.acf) {
    it(c.call, () => expectAllClose(acf(seriesOf(SM, c.series), { maxLag: c.maxLag }), c.values, 1e-10));
  }
  for (const c of SM.pacf) {
    it(c.call, () => expectAllClose(pacf(seriesOf(SM, c.series), { maxLag: c.maxLag }), c.values, 1e-10));
  }
  for (const c of SM.ccf) {
    it(c.call, () => {
      const result = ccf(seriesOf(SM, c.x), seriesOf(SM, c.y), { maxLag: c.maxLag });
      expectAllClose(result.values.subarray(c.maxLag), c.values, 1e-10);
    });
  }
  for (const c of SM.box) {
    it(c.call, () => {
      const x = seriesOf(SM, c.series);
      const lb = ljungBox(x, { lag: c.lag });
      const bp = boxPierce(x, { lag: c.lag });
      expectAllClose([lb.statistic, bp.statistic], [c.ljungBox.statistic, c.boxPierce.statistic], 0, 1e-10);
      expectAllClose([lb.pValue, bp.pValue], [c.ljungBox.pValue, c.boxPierce.pValue], 1e-300, 1e-10);
    });
  }
  for (const c of SM.adf) {
    it(c.call, () => {
      const result = adf(seriesOf(SM, c.series), { lags: c.lags });
      expect(result.nobs).toBe(c.nobs);
      expectAllClose([result.statistic], [c.statistic], 0, 1e-8);
      expectAllClose(
        [result.criticalValues['1%'], result.criticalValues['5%'], result.criticalValues['10%']],
        [c.criticalValues['1%'], c.criticalValues['5%'], c.criticalValues['10%']],
        1e-12,
      );
    });
  }
});
