import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { integerOption } from './integer-option.ts';
import { laggedProducts } from './lagged-products.ts';
import { maskMissing, type MaskedSeries } from './missing-values.ts';

export interface CrossCorrelationOptions {
  /** Highest lag in each direction; defaults to R's ⌊10·log10(n/2)⌋, capped at n − 1. */
  maxLag?: number;
  /** 'correlation' (default) or 'covariance'. */
  type?: 'correlation' | 'covariance';
}

export interface CrossCorrelationResult {
  /** −maxLag … maxLag. */
  lags: Int32Array;
  /** values[i] estimates cor(x[t + lags[i]], y[t]). */
  values: Float64Array;
}

/** Cross-covariances at lags 0..K of `lead` against `base`, with R's na.pass divisor. */
function oneSide(lead: MaskedSeries, base: MaskedSeries, maxLag: number): Float64Array {
  const n = lead.values.length;
  const sums = laggedProducts(lead.values, base.values, maxLag);
  const pairs =
    lead.present || base.present ? laggedProducts(lead.present ?? new Float64Array(n).fill(1), base.present ?? new Float64Array(n).fill(1), maxLag) : null;
  const out = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) {
    const complete = pairs ? Math.round(pairs[k]) : n - k;
    out[k] = complete > 0 ? sums[k] / (complete + k) : NaN;
  }
  return out;
}

/**
 * Sample cross-correlation function of two equally spaced series of the same length, with R's
 * sign convention: the value at lag k estimates cor(x[t + k], y[t]), so a peak at a positive
 * lag means x follows y (y leads) and a peak at a negative lag means x leads.
 *
 * c_xy(k) = (1/n) Σ_t (x_{t+k} − x̄)(y_t − ȳ), r_xy(k) = c_xy(k) / √(c_xx(0) c_yy(0))
 * (Box, Jenkins & Reinsel, *Time Series Analysis*, 4th ed., eqs. 12.1.5–12.1.6; Brockwell &
 * Davis, *Introduction to Time Series and Forecasting*, 2nd ed., §7.2). Equals R's
 * `ccf(x, y, lag.max)`; missing values follow R's na.pass rule as in `acf`.
 *
 * Cost: O(n · maxLag) or O(n log maxLag), like `acf`.
 */
export function crossCorrelation(x: Series, y: Series, options: CrossCorrelationOptions = {}): CrossCorrelationResult {
  const fn = 'ccf';
  for (const s of [x, y]) {
    if (s == null || typeof s.length !== 'number') {
      throw new AnalysisInputError(`${fn}: both series must be arrays of numbers`);
    }
  }
  if (x.length !== y.length) {
    throw new AnalysisInputError(`${fn}: the two series must have the same length (got ${x.length} and ${y.length})`);
  }
  const n = x.length;
  if (n < 2) throw new AnalysisInputError(`${fn} requires at least 2 data points (got ${n})`, { reason: 'too-few-values', need: 2, got: n });
  const maxLag = integerOption(fn, 'maxLag', options.maxLag ?? defaultMaxLag(n, 2), 0, n - 1);
  const type = options.type ?? 'correlation';
  const mx = maskMissing(x, true);
  const my = maskMissing(y, true);
  if (mx.count < 2 || my.count < 2) {
    throw new AnalysisInputError(`${fn} requires at least 2 non-missing values in each series`, { reason: 'too-few-pairs', need: 2 });
  }
  const positive = oneSide(mx, my, maxLag);
  const negative = oneSide(my, mx, maxLag);
  let scale = 1;
  if (type === 'correlation') {
    const cxx = oneSide(mx, mx, 0)[0];
    const cyy = oneSide(my, my, 0)[0];
    if (!(cxx > 0 && cyy > 0)) {
      throw new AnalysisInputError(`${fn}: a constant series has no cross-correlation`, { reason: 'constant' });
    }
    scale = 1 / Math.sqrt(cxx * cyy);
  }
  const lags = new Int32Array(2 * maxLag + 1);
  const values = new Float64Array(2 * maxLag + 1);
  for (let k = -maxLag; k <= maxLag; k++) {
    const raw = (k >= 0 ? positive[k] : negative[-k]) * scale;
    lags[k + maxLag] = k;
    values[k + maxLag] = type === 'correlation' ? Math.max(-1, Math.min(1, raw)) : raw;
  }
  return { lags, values };
}
