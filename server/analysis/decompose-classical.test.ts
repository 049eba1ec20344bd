/**
 * Classical decomposition: worked examples from the construction of the method and
 * properties on generated series. The comparison with R's decompose() and statsmodels'
 * seasonal_decompose is in tests/reference/decomposition.reference.test.ts.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from './analysis-input-error.ts';
import { decomposeClassical } from './decompose-classical.ts';

function expectClose(actual: ArrayLike<number>, expected: ArrayLike<number>, tolerance: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    if (Number.isNaN(expected[i])) {
      expect(actual[i], `index ${i}`).toBeNaN();
      continue;
    }
    const diff = Math.abs(actual[i] - expected[i]);
    if (!(diff <= tolerance)) throw new Error(`index ${i}: ${actual[i]} vs ${expected[i]} (|diff| ${diff})`);
  }
}

describe('decomposeClassical worked examples', () => {
  // Brockwell & Davis (2016), §1.5.2: the 2×p moving average passes a linear trend unchanged
  // and removes a seasonal pattern of period p that sums to zero. So for
  // x_t = t + s_(t mod 4) with s = (1, −1, 2, −2) the trend is t wherever the window fits
  // (t = 2 .. 9 of 0 .. 11), the figure is s and the remainder is 0.
  it('even period: recovers a linear trend and a zero-sum pattern exactly', () => {
    const s = [1, -1, 2, -2];
    const x = Array.from({ length: 12 }, (_, t) => t + s[t % 4]);
    const r = decomposeClassical(x, { period: 4, type: 'additive' });
    const trend = x.map((_, t) => (t >= 2 && t <= 9 ? t : NaN));
    expectClose(r.trend, trend, 1e-12);
    expectClose(r.figure, s, 1e-12);
    expectClose(
      r.seasonal,
      x.map((_, t) => s[t % 4]),
      1e-12,
    );
    expectClose(
      r.remainder,
      trend.map((v) => (Number.isNaN(v) ? NaN : 0)),
      1e-12,
    );
  });

  // Odd period 3: a plain 3-term mean; x_t = 5 + 0.5 t + s_(t mod 3) with s = (1, 0, −1).
  it('odd period: the centred mean of one cycle', () => {
    const s = [1, 0, -1];
    const x = Array.from({ length: 9 }, (_, t) => 5 + 0.5 * t + s[t % 3]);
    const r = decomposeClassical(x, { period: 3, type: 'additive' });
    expectClose(
      r.trend,
      x.map((_, t) => (t >= 1 && t <= 7 ? 5 + 0.5 * t : NaN)),
      1e-12,
    );
    expectClose(r.figure, s, 1e-12);
  });

  // Multiplicative: x_t = 40 · m_(t mod 4) with m averaging 1; the trend is 40 and the
  // remainder 1 (the moving average of a pattern with mean 1 is 1).
  it('multiplicative: a constant level times a pattern with mean 1', () => {
    const m = [1.2, 0.9, 1.1, 0.8];
    const x = Array.from({ length: 16 }, (_, t) => 40 * m[t % 4]);
    const r = decomposeClassical(x, { period: 4, type: 'multiplicative' });
    expectClose(
      r.trend,
      x.map((_, t) => (t >= 2 && t <= 13 ? 40 : NaN)),
      1e-12,
    );
    expectClose(r.figure, m, 1e-12);
    expectClose(
      r.remainder,
      x.map((_, t) => (t >= 2 && t <= 13 ? 1 : NaN)),
      1e-12,
    );
  });

  // The figure is counted from the first observation (as R's decompose does), whatever the
  // calendar: starting the same pattern one step later rotates the figure by one.
  it('counts the cycle position from the first value', () => {
    const s = [3, -1, -2, 0];
    const x = Array.from({ length: 17 }, (_, t) => 10 + s[(t + 1) % 4]);
    const r = decomposeClassical(x, { period: 4, type: 'additive' });
    expectClose(r.figure, [-1, -2, 0, 3], 1e-12);
  });

  it('leaves the trend undefined where a window holds a missing value', () => {
    const x = Array.from({ length: 24 }, (_, t) => 20 + Math.sin(t) + (t % 6));
    x[10] = NaN;
    const r = decomposeClassical(x, { period: 6, type: 'additive' });
    for (let t = 0; t < 24; t++) {
      const windowHasGap = Math.abs(t - 10) <= 3;
      const outside = t < 3 || t > 20;
      expect(Number.isNaN(r.trend[t]), `trend at ${t}`).toBe(windowHasGap || outside);
    }
    expect(r.figure.every(Number.isFinite)).toBe(true);
  });
});

const additiveSeries = fc.integer({ min: 2, max: 12 }).chain((period) =>
  fc.record({
    period: fc.constant(period),
    x: fc.array(fc.double({ min: -1e4, max: 1e4, noNaN: true }), { minLength: 2 * period + 1, maxLength: 8 * period }),
  }),
);

const positiveSeries = fc.integer({ min: 2, max: 12 }).chain((period) =>
  fc.record({
    period: fc.constant(period),
    x: fc.array(fc.double({ min: 0.01, max: 1e4, noNaN: true }), { minLength: 2 * period + 1, maxLength: 8 * period }),
  }),
);

describe('decomposeClassical properties', () => {
  it('additive: trend + seasonal + remainder = x where the trend is defined; the figure sums to 0', () => {
    fc.assert(
      fc.property(additiveSeries, ({ period, x }) => {
        const r = decomposeClassical(x, { period, type: 'additive' });
        const scale = 1 + Math.max(...x.map(Math.abs));
        for (let i = 0; i < x.length; i++) {
          if (Number.isNaN(r.trend[i])) continue;
          expect(Math.abs(r.trend[i] + r.seasonal[i] + r.remainder[i] - x[i])).toBeLessThan(1e-9 * scale);
        }
        expect(Math.abs(r.figure.reduce((a, b) => a + b, 0))).toBeLessThan(1e-9 * scale);
        for (let i = 0; i < x.length; i++) expect(r.seasonal[i]).toBe(r.figure[i % period]);
      }),
      { numRuns: 100 },
    );
  });

  it('multiplicative: trend · seasonal · remainder = x; the figure averages 1', () => {
    fc.assert(
      fc.property(positiveSeries, ({ period, x }) => {
        const r = decomposeClassical(x, { period, type: 'multiplicative' });
        for (let i = 0; i < x.length; i++) {
          if (Number.isNaN(r.trend[i])) continue;
          expect(Math.abs(r.trend[i] * r.seasonal[i] * r.remainder[i] - x[i])).toBeLessThan(1e-9 * x[i]);
        }
        expect(Math.abs(r.figure.reduce((a, b) => a + b, 0) / period - 1)).toBeLessThan(1e-12);
      }),
      { numRuns: 100 },
    );
  });

  it('never mutates its input', () => {
    fc.assert(
      fc.property(positiveSeries, fc.constantFrom('additive' as const, 'multiplicative' as const), ({ period, x }, type) => {
        const withGap = [...x];
        withGap[period] = NaN;
        const frozen = Object.freeze([...withGap]);
        expect(() => decomposeClassical(frozen, { period, type })).not.toThrow();
        const typed = Float64Array.from(withGap);
        decomposeClassical(typed, { period, type });
        expect(Array.from(typed)).toEqual(withGap);
      }),
      { numRuns: 50 },
    );
  });
});

describe('decomposeClassical input errors', () => {
  const cases: [string, () => unknown, string][] = [
    ['period below 2', () => decomposeClassical([1, 2, 3, 4], { period: 1, type: 'additive' }), 'decomposeClassical: period must be at least 2 (got 1)'],
    [
      'short series',
      () => decomposeClassical(new Array(30).fill(1), { period: 24, type: 'additive' }),
      'decomposeClassical requires at least two full periods (got 30 values for period 24)',
    ],
    [
      'empty series',
      () => decomposeClassical([], { period: 12, type: 'additive' }),
      'decomposeClassical requires at least two full periods (got 0 values for period 12)',
    ],
    [
      'too few present values',
      () => decomposeClassical([1, NaN, 2, 3, NaN, 4, 5], { period: 3, type: 'additive' }),
      'decomposeClassical requires at least two full periods (got 5 non-missing values for period 3)',
    ],
    [
      'type',
      () => decomposeClassical([1, 2, 3, 4], { period: 2, type: 'log' as 'additive' }),
      "decomposeClassical: type must be 'additive' or 'multiplicative' (got log)",
    ],
    [
      'multiplicative with zero',
      () => decomposeClassical([1, 2, 0, 4, 5], { period: 2, type: 'multiplicative' }),
      'decomposeClassical: the multiplicative model needs positive values (got 0 at index 2)',
    ],
    [
      'infinite value',
      () => decomposeClassical([1, 2, Infinity, 4, 5], { period: 2, type: 'additive' }),
      'decomposeClassical: values must be finite or NaN (got Infinity at index 2)',
    ],
  ];
  for (const [name, call, message] of cases) {
    it(name, () => {
      expect(call).toThrow(AnalysisInputError);
      expect(call).toThrow(message);
    });
  }
});
