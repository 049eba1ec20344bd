/**
 * Properties of STL that follow from its definition (Cleveland, Cleveland, McRae &
 * Terpenning 1990, J. Official Statistics 6(1):3–73), checked on generated series with
 * fast-check. The comparison with R's stats::stl and statsmodels is in
 * tests/reference/decomposition.reference.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { stl } from './stl.ts';
import { stlParameters } from './stl-parameters.ts';

/** A period from 2 to 12 and a series of two to six cycles plus a remainder, values in ±1000. */
const seriesWithPeriod = fc.integer({ min: 2, max: 12 }).chain((period) =>
  fc.record({
    period: fc.constant(period),
    x: fc.array(fc.double({ min: -1000, max: 1000, noNaN: true }), {
      minLength: 2 * period,
      maxLength: 6 * period + 5,
    }),
  }),
);

/** A seasonal pattern plus trend plus pseudo-random noise from a seed: generic real values. */
const noisySeries = fc
  .record({
    period: fc.integer({ min: 2, max: 12 }),
    cycles: fc.integer({ min: 4, max: 8 }),
    seed: fc.integer({ min: 1, max: 2147483646 }),
    amplitude: fc.double({ min: 0.1, max: 100, noNaN: true }),
  })
  .map(({ period, cycles, seed, amplitude }) => {
    let state = seed;
    const x = Array.from({ length: period * cycles + (seed % period) }, (_, i) => {
      state = (state * 48271) % 2147483647;
      return amplitude * (Math.sin((2 * Math.PI * i) / period) + 0.01 * i + state / 2147483647);
    });
    return { period, x };
  });

const windowChoice = fc.oneof(fc.constant<'periodic'>('periodic'), fc.integer({ min: 3, max: 15 }));

function range(x: ArrayLike<number>): number {
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < x.length; i++) {
    lo = Math.min(lo, x[i]);
    hi = Math.max(hi, x[i]);
  }
  return hi - lo;
}

function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, tolerance: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    const diff = Math.abs(actual[i] - expected[i]);
    if (!(diff <= tolerance)) {
      throw new Error(`index ${i}: ${actual[i]} vs ${expected[i]} (|diff| ${diff} > ${tolerance})`);
    }
  }
}

describe('stl properties', () => {
  it('seasonal + trend + remainder reproduces the series', () => {
    fc.assert(
      fc.property(seriesWithPeriod, windowChoice, fc.boolean(), ({ period, x }, seasonalWindow, robust) => {
        const r = stl(x, { period, seasonalWindow, robust });
        const sum = x.map((_, i) => r.seasonal[i] + r.trend[i] + r.remainder[i]);
        expectClose(sum, x, 1e-9 * (1 + range(x)));
      }),
      { numRuns: 60 },
    );
  });

  it("a 'periodic' seasonal repeats exactly with the period", () => {
    fc.assert(
      fc.property(seriesWithPeriod, fc.boolean(), ({ period, x }, robust) => {
        const { seasonal } = stl(x, { period, seasonalWindow: 'periodic', robust });
        for (let i = period; i < seasonal.length; i++) expect(seasonal[i]).toBe(seasonal[i - period]);
      }),
      { numRuns: 60 },
    );
  });

  // Without robustness weights every step (loess with fixed weights, moving averages, the
  // periodic means) is linear in the data, so the decomposition of a sum is the sum of the
  // decompositions.
  it('without robustness passes the decomposition is linear in the series', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 8 }).chain((period) =>
          fc.record({
            period: fc.constant(period),
            pair: fc
              .integer({ min: 2 * period, max: 6 * period })
              .chain((n) =>
                fc.tuple(
                  fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: n, maxLength: n }),
                  fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: n, maxLength: n }),
                ),
              ),
          }),
        ),
        windowChoice,
        fc.double({ min: -3, max: 3, noNaN: true }),
        ({ period, pair: [a, b] }, seasonalWindow, c) => {
          const combined = a.map((v, i) => v + c * b[i]);
          const ra = stl(a, { period, seasonalWindow });
          const rb = stl(b, { period, seasonalWindow });
          const rc = stl(combined, { period, seasonalWindow });
          const tolerance = 1e-9 * (1 + range(a) + Math.abs(c) * range(b));
          expectClose(
            rc.seasonal,
            ra.seasonal.map((v, i) => v + c * rb.seasonal[i]),
            tolerance,
          );
          expectClose(
            rc.trend,
            ra.trend.map((v, i) => v + c * rb.trend[i]),
            tolerance,
          );
        },
      ),
      { numRuns: 40 },
    );
  });

  // Robustness weights depend on residuals relative to their median, so rescaling and shifting
  // the data rescales and shifts the components and leaves the weights alone. Generic noisy
  // series are used: where many residuals are exact zeros or rounding noise, the median scale
  // is itself rounding noise and the weights are not meaningful (in R or statsmodels either).
  // The same holds where the reweighting collapses: on a short series the passes can zero a
  // large share of the points until the smoothers pass exactly through the rest, and which
  // point lands on which side of a cut-off is then decided by rounding (seen: 6 of 13 points
  // at weight 0, a scale of 0.25·(1 + 2⁻⁵²) flipping one weight from 0.945 to 1). Series where
  // more than a fifth of the weights are 0 are therefore left out.
  it('is equivariant under y → a·y + b, robust weights included', () => {
    fc.assert(
      fc.property(
        noisySeries,
        windowChoice,
        fc.double({ min: 0.25, max: 8, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        ({ period, x }, seasonalWindow, a, b) => {
          const base = stl(x, { period, seasonalWindow, robust: true });
          const residuals = Array.from(base.remainder, Math.abs).sort((p, q) => p - q);
          fc.pre(residuals[residuals.length >> 1] > 1e-9 * range(x));
          fc.pre(base.weights.filter((w) => w === 0).length <= base.weights.length / 5);
          const moved = stl(
            x.map((v) => a * v + b),
            { period, seasonalWindow, robust: true },
          );
          const tolerance = 1e-8 * (1 + a * range(x) + Math.abs(b));
          expectClose(
            moved.seasonal,
            base.seasonal.map((v) => a * v),
            tolerance,
          );
          expectClose(
            moved.trend,
            base.trend.map((v) => a * v + b),
            tolerance,
          );
          expectClose(moved.weights, base.weights, 1e-8);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('gives weights in [0, 1], all 1 without robustness passes', () => {
    fc.assert(
      fc.property(seriesWithPeriod, windowChoice, fc.boolean(), ({ period, x }, seasonalWindow, robust) => {
        const { weights } = stl(x, { period, seasonalWindow, robust });
        for (const w of weights) {
          expect(w).toBeGreaterThanOrEqual(0);
          expect(w).toBeLessThanOrEqual(1);
          if (!robust) expect(w).toBe(1);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('never mutates its input', () => {
    fc.assert(
      fc.property(seriesWithPeriod, windowChoice, fc.boolean(), ({ period, x }, seasonalWindow, robust) => {
        const frozen = Object.freeze([...x]);
        expect(() => stl(frozen, { period, seasonalWindow, robust })).not.toThrow();
        const typed = Float64Array.from(x);
        stl(typed, { period, seasonalWindow, robust });
        expect(Array.from(typed)).toEqual(x);
      }),
      { numRuns: 30 },
    );
  });
});

describe('stl on series with a known structure', () => {
  it('leaves a constant series in the trend', () => {
    const x = new Array(60).fill(21.5);
    for (const robust of [false, true]) {
      const r = stl(x, { period: 12, seasonalWindow: 7, robust });
      expectClose(r.trend, x, 1e-12);
      expectClose(r.seasonal, new Array(60).fill(0), 1e-12);
    }
  });

  // Demo data: a fictional growth-chamber logger, hourly, with a daily cycle, a slow rise, sensor
  // noise and one stuck reading 40 degrees too high. The robust fit gives the outlier no weight
  // and stays close to the fit of the clean series; the plain fit is pulled away.
  it('gives a gross outlier zero weight and keeps it out of seasonal and trend', () => {
    const period = 24;
    let state = 12345;
    const uniform = () => {
      state = (state * 48271) % 2147483647;
      return state / 2147483647;
    };
    const clean = Array.from({ length: 24 * 14 }, (_, i) => 22 + 2 * Math.sin((2 * Math.PI * i) / period) + 0.01 * i + 0.4 * (uniform() - 0.5));
    const spike = 150;
    const x = [...clean];
    x[spike] += 40;
    const reference = stl(clean, { period, seasonalWindow: 7, robust: true });
    const robust = stl(x, { period, seasonalWindow: 7, robust: true });
    const plain = stl(x, { period, seasonalWindow: 7 });
    const deviation = (a: Float64Array, b: Float64Array) => Math.max(...a.map((v, i) => Math.abs(v - b[i])));
    expect(robust.weights[spike]).toBe(0);
    expect(robust.remainder[spike]).toBeGreaterThan(39);
    expect(deviation(robust.trend, reference.trend)).toBeLessThan(0.05);
    expect(deviation(robust.seasonal, reference.seasonal)).toBeLessThan(0.2);
    expect(deviation(plain.trend, reference.trend)).toBeGreaterThan(1);
    expect(deviation(plain.seasonal, reference.seasonal)).toBeGreaterThan(5);
  });
});

describe('stl options', () => {
  // R 4.2.2: stl(nottem, s.window = 7)$win is 7 23 13, $jump 1 3 2 (tests/reference fixture
  // nottem-s7); the full comparison with R's resolved parameters is in the reference test.
  it("fills in R's defaults", () => {
    const s = stlParameters(240, { period: 12, seasonalWindow: 7 });
    expect([s.seasonalWindow, s.trendWindow, s.lowpassWindow]).toEqual([7, 23, 13]);
    expect([s.seasonalJump, s.trendJump, s.lowpassJump]).toEqual([1, 3, 2]);
    expect([s.seasonalDegree, s.trendDegree, s.lowpassDegree, s.inner, s.outer]).toEqual([0, 1, 1, 2, 0]);
    const robust = stlParameters(240, { period: 12, seasonalWindow: 'periodic', robust: true, trendDegree: 0 });
    expect([robust.seasonalWindow, robust.seasonalJump, robust.inner, robust.outer]).toEqual([2401, 241, 1, 15]);
    expect(robust.lowpassDegree).toBe(0);
  });

  it('raises even windows to the next odd number', () => {
    const s = stlParameters(72, { period: 12, seasonalWindow: 8, trendWindow: 20, lowpassWindow: 14 });
    expect([s.seasonalWindow, s.trendWindow, s.lowpassWindow]).toEqual([9, 21, 15]);
    expect([s.seasonalJump, s.trendJump, s.lowpassJump]).toEqual([1, 2, 2]);
  });
});

describe('stl input errors', () => {
  const cases: [string, () => unknown, string][] = [
    ['period below 2', () => stl([1, 2, 3, 4], { period: 1, seasonalWindow: 7 }), 'stl: period must be at least 2 (got 1)'],
    ['fractional period', () => stl(new Array(30).fill(1), { period: 2.5, seasonalWindow: 7 }), 'stl: period must be a whole number (got 2.5)'],
    [
      'short series',
      () => stl(new Array(30).fill(1), { period: 24, seasonalWindow: 7 }),
      'stl requires at least two full periods (got 30 values for period 24)',
    ],
    ['empty series', () => stl([], { period: 24, seasonalWindow: 'periodic' }), 'stl requires at least two full periods (got 0 values for period 24)'],
    [
      'missing value',
      () => stl([1, 2, 3, NaN, 5, 6, 7, 8], { period: 2, seasonalWindow: 7 }),
      'stl: the series must be complete (got NaN at index 3); fill or cut gaps first',
    ],
    [
      'seasonal window',
      () => stl(new Array(48).fill(1), { period: 12, seasonalWindow: 1 }),
      "stl: seasonalWindow must be 'periodic' or a whole number of at least 3 (got 1)",
    ],
    ['degree', () => stl(new Array(48).fill(1), { period: 12, seasonalWindow: 7, trendDegree: 2 as 1 }), 'stl: trendDegree must be 0 or 1 (got 2)'],
    ['jump', () => stl(new Array(48).fill(1), { period: 12, seasonalWindow: 7, trendJump: 0 }), 'stl: trendJump must be a whole number of at least 1 (got 0)'],
  ];
  for (const [name, call, message] of cases) {
    it(name, () => {
      expect(call).toThrow(AnalysisInputError);
      expect(call).toThrow(message);
    });
  }

  it('accepts exactly two full periods', () => {
    const x = Array.from({ length: 24 }, (_, i) => Math.sin(i) + i / 10);
    const r = stl(x, { period: 12, seasonalWindow: 'periodic' });
    expect(r.trend.every(Number.isFinite)).toBe(true);
  });
});
