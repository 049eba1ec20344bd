/**
 * Lagbook's inference engine against R 4.2.2 (`stats`, `sandwich` 3.0.2) on datasets that ship
 * with R and one seeded simulation made in R. The fixture (series, exact calls, versions) is
 * written by inference.R in this folder; see README.md to regenerate it.
 */
import { describe, expect, it } from 'vitest';
import { compareMeans } from '../../server/analysis/compare-means.ts';
import { prewhitenedCcf } from '../../server/analysis/prewhitened-ccf.ts';
import { trendTest } from '../../server/analysis/trend-test.ts';
import { loadReferenceFixture, type ReferenceJson as Json } from './reference-fixture.ts';

const R = loadReferenceFixture('inference-r.json');

/** R's NA is stored as null; the engine's missing value is NaN. */
const seriesOf = (name: string): number[] => R.series[name].map((v: number | null) => (v === null ? NaN : v));
/** inference.R stores scalars as one-element arrays. */
const one = (v: number[] | number): number => (Array.isArray(v) ? v[0] : v);

function expectClose(actual: number, expected: number, absTol: number, relTol: number, label: string): void {
  expect(Math.abs(actual - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(absTol + relTol * Math.abs(expected));
}

function expectAllClose(actual: ArrayLike<number>, expected: ArrayLike<number | null>, absTol: number, relTol: number, label: string): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const e = expected[i];
    if (e === null) {
      expect(Number.isNaN(actual[i]), `${label} index ${i}: expected missing`).toBe(true);
      continue;
    }
    expectClose(actual[i], e, absTol, relTol, `${label} index ${i}`);
  }
}

describe('the fixture records its provenance', () => {
  it('names R 4.2.2 and sandwich 3.0.2', () => {
    expect(R.generator.tool).toMatch(/^R version 4\.2\.2/);
    expect(R.generator.sandwich).toBe('3.0.2');
  });
});

describe('prewhitenedCcf against R ar() + filter() + ccf(na.action = na.pass) (CCF 1e-10; AR 1e-8)', () => {
  for (const c of R.prewhitenedCcf) {
    it(c.call, () => {
      const r = prewhitenedCcf(seriesOf(c.response), seriesOf(c.input), { maxLag: one(c.maxLag) });
      expect(r.ar.order).toBe(one(c.order));
      expectAllClose(r.ar.coefficients, c.coefficients ?? [], 1e-8, 1e-8, 'ar');
      expectClose(r.ar.variance, one(c.variance), 0, 1e-8, 'var.pred');
      expect(r.pairs).toBe(one(c.pairs));
      expect(Array.from(r.lags)).toEqual(c.lags);
      expectAllClose(r.values, c.values, 1e-10, 0, 'ccf');
      expectClose(r.band, one(c.band), 0, 1e-12, 'band');
      expectClose(r.simultaneousBand, one(c.simultaneousBand), 0, 1e-12, 'simultaneous band');
    });
  }
  it('the seeded transfer-function pair (response answers the input after 3 steps): the first lag beyond the simultaneous band is +3', () => {
    const c = R.prewhitenedCcf.find((x: Json) => x.response === 'sim.response');
    const r = prewhitenedCcf(seriesOf(c.response), seriesOf(c.input), { maxLag: one(c.maxLag) });
    const crossing = Array.from(r.lags).filter((_, i) => Math.abs(r.values[i]) > r.simultaneousBand);
    expect(crossing[0]).toBe(3);
    // The impulse response 0.5·0.9^(k−3) decays slowly, so the single largest value may sit at +3 or just after it.
    expect(r.strongest?.significant).toBe(true);
    expect(r.strongest!.lag).toBeGreaterThanOrEqual(3);
  });
});

describe('trendTest against R lm(x ~ t) + sandwich::NeweyWest(prewhite = FALSE, adjust = FALSE) (1e-8 relative)', () => {
  const TOL = 1e-8;
  for (const c of R.trend) {
    it(`${c.call}${c.lagGiven ? '' : ' (default lag ⌊4 (n/100)^(2/9)⌋)'}`, () => {
      const r = trendTest(seriesOf(c.series), c.lagGiven ? { lag: one(c.lag) } : {});
      expect(r.lag).toBe(one(c.lag));
      expect(r.nonMissing).toBe(one(c.nonMissing));
      expectClose(r.slope, one(c.slope), 0, TOL, 'slope');
      expectClose(r.intercept, one(c.intercept), 0, TOL, 'intercept');
      expectClose(r.standardErrorOls, one(c.standardErrorOls), 0, TOL, 'OLS se');
      expectClose(r.standardErrorHac, one(c.standardErrorHac), 0, TOL, 'HAC se (slope)');
      expectClose(r.interceptStandardErrorHac, one(c.standardErrorInterceptHac), 0, TOL, 'HAC se (intercept)');
      expectClose(r.tHac, one(c.tHac), 0, TOL, 'tHac');
      // 2 * pnorm(-|t|); below 1e-300 both are 0 (co2's slope is 100+ standard errors from 0).
      expectClose(r.pValueHac, one(c.pValueHac), 1e-300, TOL, 'pValueHac');
      expectAllClose(r.interval, c.interval, 0, TOL, 'interval');
      expectAllClose(r.intervalOls, c.intervalOls, 0, TOL, 'confint(fit)');
    });
  }
});

describe('compareMeans: Welch part against R t.test(b, a); effective part against the same formulas evaluated in R on acf() (1e-10)', () => {
  const TOL = 1e-10;
  const expectTest = (actual: Json, expected: Json, label: string) => {
    expectClose(actual.standardError, one(expected.standardError), 0, TOL, `${label} se`);
    expectClose(actual.df, one(expected.df), 0, TOL, `${label} df`);
    expectClose(actual.statistic, one(expected.statistic), 0, TOL, `${label} t`);
    expectClose(actual.pValue, one(expected.pValue), 0, TOL, `${label} p`);
    expectAllClose(actual.interval, expected.interval, 0, TOL, `${label} interval`);
  };
  for (const c of R.compareMeans) {
    it(c.call, () => {
      const r = compareMeans(seriesOf(c.a), seriesOf(c.b));
      expectClose(r.difference, one(c.difference), 1e-13, TOL, 'mean(b) - mean(a)');
      // R 4.2.2 stats::t.test (Welch, var.equal = FALSE)
      expectTest(r.welch, c.welch, 'Welch');
      // inference.R: tau by Geyer's initial monotone sequence on acf(x, lag.max = n - 1), nEff = n/tau,
      // se = sqrt(sd_a^2/nEff_a + sd_b^2/nEff_b), Welch-Satterthwaite df on nEff, qt/pt.
      for (const [mine, theirs] of [
        [r.a, c.summaryA],
        [r.b, c.summaryB],
      ] as const) {
        expect(mine.n).toBe(one(theirs.n));
        expectClose(mine.mean, one(theirs.mean), 0, TOL, 'mean');
        expectClose(mine.sd, one(theirs.sd), 0, TOL, 'sd');
        expectClose(mine.tau, one(theirs.tau), 0, TOL, 'tau');
        expectClose(mine.nEff, one(theirs.nEff), 0, TOL, 'nEff');
      }
      expectTest(r.effective, c.effective, 'effective');
    });
  }
  it('Nile before/after 1898 (Cobb 1978): the flow fell by about 244 (10^8 m^3/yr); both intervals exclude 0', () => {
    const c = R.compareMeans.find((x: Json) => x.a === 'Nile.1871to1897');
    const r = compareMeans(seriesOf(c.a), seriesOf(c.b));
    expect(r.effective.interval[1]).toBeLessThan(0);
    expect(r.effective.interval[1] - r.effective.interval[0]).toBeGreaterThan(r.welch.interval[1] - r.welch.interval[0]);
  });
});
