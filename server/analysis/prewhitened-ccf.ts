import { AnalysisInputError, type Series, assertSeries, presentValues } from './analysis-input-error.ts';
import { arFilter } from './ar-filter.ts';
import { arYuleWalker } from './ar-yule-walker.ts';
import { crossCorrelation } from './cross-correlation.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { integerOption } from './integer-option.ts';
import { normalQuantile } from './normal-quantile.ts';

/** Fewest non-missing readings in each series for which a prewhitened CCF is computed. */
const MIN_POINTS = 10;

export interface PrewhitenedCcfOptions {
  /**
   * Highest lag in each direction; default R's ⌊10·log10(n/2)⌋ (as `ccf`), capped so that the
   * extreme lag still has a filtered pair.
   */
  maxLag?: number;
  /** 1 − confidence level of both bands (default 0.05). */
  alpha?: number;
}

export interface PrewhitenedCcfStrongest {
  /** Lag of the largest |value| (ties: the smaller |lag|, then the negative one). */
  lag: number;
  value: number;
  /** |value| lies beyond the simultaneous band: the one claim this function supports. */
  significant: boolean;
}

export interface PrewhitenedCcfResult {
  /** The AR model of the input (second argument) whose filter was applied to both series. */
  ar: { order: number; coefficients: Float64Array; variance: number };
  /** Time steps at which both filtered series are present (n − order without gaps). */
  pairs: number;
  /** −maxLag … maxLag. */
  lags: Int32Array;
  /** values[i] estimates cor(response′[t + lags[i]], input′[t]) of the filtered pair. */
  values: Float64Array;
  alpha: number;
  /** Per-lag half-width z(1 − α/2)/√pairs: for reading one lag chosen in advance. */
  band: number;
  /** Half-width that all 2·maxLag + 1 lags stay inside together with probability 1 − α under no relation. */
  simultaneousBand: number;
  simultaneousMethod: 'sidak';
  /** Null only when no lag has a value (gaps leave no pair). */
  strongest: PrewhitenedCcfStrongest | null;
}

function finiteCount(x: Float64Array): number {
  let c = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) c++;
  return c;
}

/**
 * Prewhitened cross-correlation of a response series with its input (driver): which delay, if
 * any, links them, without the spurious peaks two autocorrelated series produce in a raw CCF.
 *
 * Argument order: `response` first (the channel being explained), `input` second (the series
 * thought to drive it). The input is modelled as AR(p) fitted by Yule–Walker with p chosen by
 * AIC, as R's `ar(input)` (defaults `order.max = min(n − 1, ⌊10·log10 n⌋)`, `demean = TRUE`,
 * `na.action = na.pass`; `arYuleWalker`). Both series are passed through that one filter after
 * subtracting their own means: e_t = (s_t − s̄) − Σ φ_i (s_{t−i} − s̄), the first p values
 * missing (R: `filter(s - mean(s, na.rm = TRUE), c(1, -phi), sides = 1)`). The filtered input is
 * then close to white noise, so under "no relation" each cross-correlation of the filtered pair
 * is approximately N(0, 1/pairs) whatever the response's own persistence, and a delayed
 * response shows as a peak at its delay (Box, Jenkins, Reinsel & Ljung, *Time Series Analysis*,
 * 5th ed., 2015, §12.2.2; Haugh 1976, JASA 71:378–385). The filter comes from the *input*
 * because that is what whitens the input and leaves the transfer function's impulse
 * response visible in the CCF (Box et al. §12.2.2).
 *
 * CCF of the filtered pair by `crossCorrelation` with R's sign convention: the value at lag k
 * estimates cor(response′[t + k], input′[t]); a peak at k > 0 means the response follows the
 * input by k steps. Equals R's `ccf(rf, xf, lag.max, na.action = na.pass)` on the filtered pair.
 * Gaps (NaN) are supported with R's na.pass rule throughout (AR fit, filter, CCF).
 *
 * Bands: per lag ±z(1 − α/2)/√pairs; simultaneous over the m = 2·maxLag + 1 lags by Šidák's
 * correction, ±z(1 − α_m/2)/√pairs with α_m = 1 − (1 − α)^{1/m} (Šidák 1967, JASA 62:626–633),
 * treating the lags as independent under the null (exact for white filtered series in large
 * samples). `strongest.significant` says whether the largest |value| crosses that band.
 *
 * Cost: O(n · (p + maxLag)) or less (the CCF may use FFTs).
 */
export function prewhitenedCcf(response: Series, input: Series, options: PrewhitenedCcfOptions = {}): PrewhitenedCcfResult {
  const fn = 'prewhitenedCcf';
  assertSeries(response, fn);
  assertSeries(input, fn);
  if (response.length !== input.length) {
    throw new AnalysisInputError(`${fn}: the two series must have the same length (got ${response.length} and ${input.length})`);
  }
  const n = response.length;
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  const inResponse = presentValues(response, fn);
  const inInput = presentValues(input, fn);
  const fewest = Math.min(inResponse.n, inInput.n);
  if (fewest < MIN_POINTS) {
    throw new AnalysisInputError(`${fn} requires at least ${MIN_POINTS} data points in each series (got ${fewest})`, {
      reason: 'too-few-values',
      need: MIN_POINTS,
      got: fewest,
    });
  }
  for (const [name, s, mean] of [
    ['response (first argument)', response, inResponse.sum / inResponse.n],
    ['input (second argument)', input, inInput.sum / inInput.n],
  ] as const) {
    let varies = false;
    for (let i = 0; i < s.length && !varies; i++) varies = !Number.isNaN(s[i]) && s[i] !== mean;
    if (!varies) throw new AnalysisInputError(`${fn}: the ${name} is constant, so it has no cross-correlation`, { reason: 'constant' });
  }

  const model = arYuleWalker(input);
  const p = model.order;
  const inputFiltered = arFilter(input, model.coefficients, model.mean);
  const responseFiltered = arFilter(response, model.coefficients, inResponse.sum / inResponse.n);
  let pairs = 0;
  for (let t = 0; t < n; t++) if (!Number.isNaN(inputFiltered[t]) && !Number.isNaN(responseFiltered[t])) pairs++;
  if (pairs < MIN_POINTS || finiteCount(inputFiltered) < 2 || finiteCount(responseFiltered) < 2) {
    throw new AnalysisInputError(
      `${fn}: after the AR(${p}) filter only ${pairs} time steps have both series present (at least ${MIN_POINTS} needed); fill the gaps or choose a longer range`,
      { reason: 'too-few-pairs', need: MIN_POINTS, got: pairs },
    );
  }
  const maxLag = integerOption(fn, 'maxLag', options.maxLag ?? Math.min(defaultMaxLag(n, 2), n - 1 - p), 0, n - 1 - p);
  const { lags, values } = crossCorrelation(responseFiltered, inputFiltered, { maxLag });

  const m = 2 * maxLag + 1;
  const perLagAlpha = -Math.expm1(Math.log1p(-alpha) / m); // 1 − (1 − α)^{1/m}, without cancellation
  const root = Math.sqrt(pairs);
  const band = normalQuantile(1 - alpha / 2) / root;
  const simultaneousBand = normalQuantile(1 - perLagAlpha / 2) / root;

  let best = -1;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    if (best < 0) {
      best = i;
      continue;
    }
    const a = Math.abs(v);
    const b = Math.abs(values[best]);
    if (a > b || (a === b && Math.abs(lags[i]) < Math.abs(lags[best]))) best = i;
  }
  return {
    ar: { order: p, coefficients: model.coefficients, variance: model.variance },
    pairs,
    lags,
    values,
    alpha,
    band,
    simultaneousBand,
    simultaneousMethod: 'sidak',
    strongest: best < 0 ? null : { lag: lags[best], value: values[best], significant: Math.abs(values[best]) > simultaneousBand },
  };
}
