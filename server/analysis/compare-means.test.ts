import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { compareMeans } from './compare-means.ts';
import { effectiveSampleSize } from './effective-sample-size.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

describe('compareMeans', () => {
  it('difference is mean(b) − mean(a); the effective SE is √(s_a²/n_eff,a + s_b²/n_eff,b) with effectiveSampleSize', () => {
    const a = simulateArma({ ar: [0.8] }, 600, 1);
    const b = simulateArma({ ar: [0.8] }, 400, 2).map((v) => v + 1);
    const r = compareMeans(a, b);
    const ea = effectiveSampleSize(a);
    const eb = effectiveSampleSize(b);
    expect(r.difference).toBeCloseTo(eb.mean - ea.mean, 13);
    expect(r.a).toMatchObject({ n: 600, tau: ea.tau, nEff: ea.ess });
    expect(r.b).toMatchObject({ n: 400, tau: eb.tau, nEff: eb.ess });
    const va = r.a.sd ** 2 / ea.ess;
    const vb = r.b.sd ** 2 / eb.ess;
    expect(r.effective.standardError).toBeCloseTo(Math.sqrt(va + vb), 13);
    // Welch–Satterthwaite with the effective sizes.
    expect(r.effective.df).toBeCloseTo((va + vb) ** 2 / (va ** 2 / (ea.ess - 1) + vb ** 2 / (eb.ess - 1)), 9);
    expect(r.welch.standardError).toBeCloseTo(Math.sqrt(r.a.sd ** 2 / 600 + r.b.sd ** 2 / 400), 13);
    // Persistent readings: the honest interval is wider than the naive one.
    expect(r.effective.interval[1] - r.effective.interval[0]).toBeGreaterThan(2 * (r.welch.interval[1] - r.welch.interval[0]));
    expect(r.caution).toBeNull();
  });

  it('Welch part on a small worked example: a = 1..10, b = (3..11, 20); R 4.2.2 t.test(b, a)', () => {
    const a = Array.from({ length: 10 }, (_, i) => i + 1);
    const b = Array.from({ length: 10 }, (_, i) => (i === 9 ? 20 : i + 3));
    const r = compareMeans(a, b);
    expect(r.difference).toBeCloseTo(2.8, 13); // 8.3 − 5.5 by hand
    // R 4.2.2: t.test(c(3:11, 20), 1:10) → t = 1.54761494445268, df = 15.0813346910547,
    // p-value = 0.142440289869274, 95 % CI −1.05448373505894 … 6.65448373505894.
    expect(r.welch.statistic).toBeCloseTo(1.54761494445268, 12);
    expect(r.welch.df).toBeCloseTo(15.0813346910547, 11);
    expect(r.welch.pValue).toBeCloseTo(0.142440289869274, 13);
    expect(r.welch.interval[0]).toBeCloseTo(-1.05448373505894, 12);
    expect(r.welch.interval[1]).toBeCloseTo(6.65448373505894, 12);
  });

  it('equal-mean AR(1) pairs (φ = 0.9, n = 500): the effective interval covers 0 in ≥ 85 % of seeds, the naive one far less', () => {
    let effective = 0;
    let naive = 0;
    const runs = 200;
    for (let s = 0; s < runs; s++) {
      const r = compareMeans(simulateArma({ ar: [0.9] }, 500, 2000 + s), simulateArma({ ar: [0.9] }, 500, 7000 + s));
      if (r.effective.interval[0] <= 0 && r.effective.interval[1] >= 0) effective++;
      if (r.welch.interval[0] <= 0 && r.welch.interval[1] >= 0) naive++;
    }
    expect(effective / runs).toBeGreaterThanOrEqual(0.85);
    expect(naive / runs).toBeLessThan(0.6);
  });

  it('cautions when a range is shorter than 10 autocorrelation times (n_eff < 10)', () => {
    const r = compareMeans(simulateArma({ ar: [0.95] }, 60, 3), simulateArma({}, 400, 4));
    expect(r.a.nEff).toBeLessThan(10);
    expect(r.caution).toMatch(
      /^range a holds about \d+\.\d independent readings \(n = 60, autocorrelation time \d+\.\d steps\): shorter than 10 autocorrelation times/,
    );
    expect(r.caution).not.toMatch(/range b/);
  });

  it('a constant range adds no variance (τ = 1); missing readings are left out', () => {
    const a = new Array(30).fill(4);
    const b = Array.from(simulateArma({ ar: [0.3] }, 50, 5), (v) => v + 5);
    b[7] = NaN;
    const r = compareMeans(a, b);
    expect(r.a).toEqual({ n: 30, mean: 4, sd: 0, tau: 1, nEff: 30 });
    expect(r.b.n).toBe(49);
    expect(r.effective.standardError).toBeCloseTo(r.b.sd / Math.sqrt(r.b.nEff), 13);
  });

  it('property: shifting range b by δ shifts the difference and both intervals by δ and leaves the standard errors alone', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }), (seed, delta) => {
        const a = simulateArma({ ar: [0.7] }, 120, seed);
        const b = simulateArma({ ar: [0.7] }, 90, seed + 1);
        const r = compareMeans(a, b);
        const s = compareMeans(
          a,
          b.map((v) => v + delta),
        );
        const tol = 1e-9 * (1 + Math.abs(delta));
        expect(Math.abs(s.difference - r.difference - delta)).toBeLessThanOrEqual(tol);
        for (const k of ['effective', 'welch'] as const) {
          expect(Math.abs(s[k].standardError - r[k].standardError)).toBeLessThanOrEqual(1e-9 * r[k].standardError);
          expect(Math.abs(s[k].interval[0] - r[k].interval[0] - delta)).toBeLessThanOrEqual(tol);
          expect(Math.abs(s[k].interval[1] - r[k].interval[1] - delta)).toBeLessThanOrEqual(tol);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('never mutates its inputs', () => {
    const a = Array.from(simulateArma({ ar: [0.5] }, 40, 1));
    const b = Array.from(simulateArma({ ar: [0.5] }, 40, 2));
    a[3] = NaN;
    const [ca, cb] = [a.slice(), b.slice()];
    compareMeans(a, b);
    expect(() => compareMeans(Object.freeze([...a]), Object.freeze([...b]))).not.toThrow(); // a write would throw
    expect(a).toEqual(ca);
    expect(b).toEqual(cb);
  });

  it('refuses bad input with a clear message', () => {
    const x = Array.from(simulateArma({}, 40, 8));
    expect(() => compareMeans([1, 2, 3, 4], x)).toThrow(
      new AnalysisInputError('compareMeans requires at least 10 data points in range a (got 4)', { reason: 'too-few-in-range', need: 10, got: 4, range: 'a' }),
    );
    expect(() => compareMeans(x, [1, NaN, 2])).toThrow('compareMeans requires at least 10 data points in range b (got 2)');
    expect(() => compareMeans(new Array(12).fill(1), new Array(15).fill(2))).toThrow(
      'compareMeans: both ranges are constant, so the difference of their means has no sampling error to estimate',
    );
    expect(() => compareMeans(x, x, { alpha: 2 })).toThrow('compareMeans: alpha must be between 0 and 1 (got 2)');
    expect(() => compareMeans(x, null as never)).toThrow('compareMeans: the series must be an array of numbers');
  });
});
