/**
 * Contracts every engine function keeps: inputs are never mutated, and too-short input fails
 * with an AnalysisInputError whose exact message names the function and the count.
 */
import { describe, expect, it } from 'vitest';
import {
  AnalysisInputError,
  acf,
  acfBands,
  adf,
  arYuleWalker,
  boxPierce,
  ccf,
  detectPeriod,
  difference,
  effectiveSampleSize,
  identifyProcess,
  ljungBox,
  pacf,
  periodogram,
  regularize,
  stl,
  decomposeClassical,
} from './index.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

const base = Array.from(simulateArma({ ar: [0.6] }, 400, 11));
base[17] = NaN;
base[230] = NaN;

/** Each call gets a frozen array (writes would throw) and a Float64Array checked afterwards. */
const calls: [string, (x: ArrayLike<number>) => unknown][] = [
  ['acf', (x) => acf(x, { maxLag: 80 })],
  ['pacf', (x) => pacf(x, { maxLag: 20 })],
  ['acfBands', (x) => acfBands(x, { kind: 'bartlett', maxLag: 10 })],
  ['ljungBox', (x) => ljungBox(x, { lag: 10 })],
  ['boxPierce', (x) => boxPierce(x, { lag: 10, fitdf: 1 })],
  ['ccf', (x) => ccf(x, Array.from(x).reverse(), { maxLag: 70 })],
  ['arYuleWalker', (x) => arYuleWalker(x)],
  ['difference', (x) => difference(x, { lag: 2, order: 2 })],
  [
    'regularize',
    (x) =>
      regularize(
        Array.from(x, (_, i) => (i * 7919) % 400),
        x,
        { step: 3, agg: 'median' },
      ),
  ],
  ['detectPeriod', (x) => detectPeriod(x)],
  ['periodogram', (x) => periodogram(x)],
  ['effectiveSampleSize', (x) => effectiveSampleSize(x)],
  ['identifyProcess', (x) => identifyProcess(x)],
  ['adf', (x) => adf(Array.from(x).filter((v) => !Number.isNaN(v)))],
  ['decomposeClassical', (x) => decomposeClassical(x, { period: 12, type: 'additive' })],
  [
    'stl',
    (x) =>
      stl(
        Array.from(x).filter((v) => !Number.isNaN(v)),
        { period: 12, seasonalWindow: 7, robust: true },
      ),
  ],
];

describe('inputs are never mutated', () => {
  for (const [name, call] of calls) {
    it(name, () => {
      const frozen = Object.freeze([...base]);
      expect(() => call(frozen)).not.toThrow();
      const typed = Float64Array.from(base);
      const copy = Float64Array.from(typed);
      call(typed);
      expect(Object.is(typed[17], NaN) || Number.isNaN(typed[17])).toBe(true);
      expect(Array.from(typed)).toEqual(Array.from(copy));
    });
  }
});

describe('empty and short inputs fail with exact messages', () => {
  const cases: [string, () => unknown, string][] = [
    ['acf', () => acf([1]), 'acf requires at least 2 data points (got 1)'],
    ['acf all missing', () => acf([NaN, NaN, 1]), 'acf requires at least 2 non-missing values (got 1)'],
    ['acf lag', () => acf([1, 2, 3], { maxLag: 3 }), 'acf: maxLag must be a whole number from 0 to 2 (got 3)'],
    ['acf constant', () => acf([2, 2, 2]), 'acf: the series is constant, so its autocorrelation is undefined'],
    ['pacf', () => pacf([]), 'pacf requires at least 2 data points (got 0)'],
    ['acfBands', () => acfBands([1], { n: 10, kind: 'white-noise' }), 'acfBands requires an ACF with at least lags 0 and 1 (got 1 values)'],
    ['acfBands kind', () => acfBands([1, 0.5], { n: 10, kind: 'wide' as never }), "acfBands: kind must be 'white-noise' or 'bartlett' (got wide)"],
    ['ljungBox', () => ljungBox([1, 2], { lag: 1 }), 'ljungBox requires at least 3 data points (got 2)'],
    ['boxPierce fitdf', () => boxPierce([1, 3, 2, 4], { lag: 2, fitdf: 2 }), 'boxPierce: fitdf must be a whole number from 0 to 1 (got 2)'],
    ['ccf', () => ccf([1], [2]), 'ccf requires at least 2 data points (got 1)'],
    ['ccf lengths', () => ccf([1, 2, 3], [1, 2]), 'ccf: the two series must have the same length (got 3 and 2)'],
    ['arYuleWalker', () => arYuleWalker([1, 2]), 'arYuleWalker requires at least 3 data points (got 2)'],
    ['difference', () => difference([1, 2, 3, 4], { lag: 2, order: 2 }), 'difference requires more than lag × order = 4 data points (got 4)'],
    ['regularize', () => regularize([], [], { step: 1000, agg: 'mean' }), 'regularize requires at least 1 reading with a value (got 0)'],
    ['regularize step', () => regularize([0], [1], { step: 0, agg: 'mean' }), 'regularize: step must be a positive number of milliseconds (got 0)'],
    ['detectPeriod', () => detectPeriod([1, 2, 3, 4, 5, 6, 7]), 'detectPeriod requires at least 8 data points (got 7)'],
    ['periodogram', () => periodogram([1, 2, 3]), 'periodogram requires at least 4 data points (got 3)'],
    ['effectiveSampleSize', () => effectiveSampleSize([1, 2, NaN, 3]), 'effectiveSampleSize requires at least 4 data points (got 3)'],
    ['identifyProcess', () => identifyProcess(new Array(29).fill(1)), 'identifyProcess requires at least 30 data points (got 29)'],
    ['adf', () => adf([1, 2, 3]), 'augmentedDickeyFuller requires at least 10 data points (got 3)'],
    ['stl short', () => stl(new Array(30).fill(1), { period: 24, seasonalWindow: 7 }), 'stl requires at least two full periods (got 30 values for period 24)'],
    ['stl period', () => stl([1, 2, 3, 4], { period: 1, seasonalWindow: 'periodic' }), 'stl: period must be at least 2 (got 1)'],
    [
      'stl gap',
      () => stl([1, 2, NaN, 4, 5, 6], { period: 2, seasonalWindow: 'periodic' }),
      'stl: the series must be complete (got NaN at index 2); fill or cut gaps first',
    ],
    [
      'decomposeClassical period',
      () => decomposeClassical([1, 2, 3], { period: 1, type: 'additive' }),
      'decomposeClassical: period must be at least 2 (got 1)',
    ],
    [
      'decomposeClassical type',
      () => decomposeClassical([1, 2, 3, 4], { period: 2, type: 'both' as never }),
      "decomposeClassical: type must be 'additive' or 'multiplicative' (got both)",
    ],
  ];
  for (const [label, call, message] of cases) {
    it(label, () => {
      let thrown: unknown;
      try {
        call();
      } catch (error) {
        thrown = error;
      }
      expect(thrown).toBeInstanceOf(AnalysisInputError);
      expect((thrown as Error).message).toBe(message);
    });
  }
});
