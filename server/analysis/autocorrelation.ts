import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { defaultMaxLag } from './default-max-lag.ts';
import { integerOption } from './integer-option.ts';
import { laggedProducts } from './lagged-products.ts';
import { maskMissing } from './missing-values.ts';

export interface AutocorrelationOptions {
  /** Highest lag; defaults to R's ⌊10·log10(n)⌋, capped at n − 1. */
  maxLag?: number;
  /** 'correlation' (default) or 'covariance'. */
  type?: 'correlation' | 'covariance';
  /** Subtract the mean of the present values first (default true). */
  demean?: boolean;
  /** Force the direct or the FFT path; 'auto' (default) takes the faster one. */
  method?: 'auto' | 'direct' | 'fft';
}

/**
 * Sample autocorrelation (or autocovariance) function at lags 0..maxLag: the basic tool for
 * seeing how long a reading "remembers" earlier readings.
 *
 * Autocovariance with divisor n, c_k = (1/n) Σ_{t=1}^{n-k} (x_{t+k} − x̄)(x_t − x̄), and
 * r_k = c_k / c_0 (Box, Jenkins & Reinsel, *Time Series Analysis*, 4th ed., eqs. 2.1.12–2.1.13;
 * Brockwell & Davis, *Introduction to Time Series and Forecasting*, 2nd ed., Def. 1.4.4). The
 * divisor n (not n − k) keeps the sequence positive semi-definite.
 *
 * Missing values (NaN) follow R's `acf(x, na.action = na.pass)`: pairs with a missing member are
 * skipped and lag k divides by (complete pairs at lag k) + k, which is n when nothing is
 * missing; a lag with no complete pair is NaN; correlations are clipped to [−1, 1].
 *
 * Cost: O(n · maxLag) by direct summation for few lags, O(n log maxLag) through blocked FFTs
 * for many; the two paths agree to about 1e-14.
 */
export function autocorrelation(x: Series, options: AutocorrelationOptions = {}): Float64Array {
  const fn = 'acf';
  assertSeries(x, fn);
  const n = x.length;
  if (n < 2) throw new AnalysisInputError(`${fn} requires at least 2 data points (got ${n})`, { reason: 'too-few-values', need: 2, got: n });
  const maxLag = integerOption(fn, 'maxLag', options.maxLag ?? defaultMaxLag(n), 0, n - 1);
  const { type = 'correlation', demean = true, method = 'auto' } = options;
  if (type !== 'correlation' && type !== 'covariance') {
    throw new AnalysisInputError(`${fn}: type must be 'correlation' or 'covariance' (got ${String(type)})`);
  }

  const masked = maskMissing(x, demean);
  if (masked.count < 2) {
    throw new AnalysisInputError(`${fn} requires at least 2 non-missing values (got ${masked.count})`, {
      reason: 'too-few-values',
      need: 2,
      got: masked.count,
    });
  }
  const sums = laggedProducts(masked.values, masked.values, maxLag, method);
  const present = masked.present;
  const pairs = present ? laggedProducts(present, present, maxLag, method) : null;
  const out = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) {
    const complete = pairs ? Math.round(pairs[k]) : n - k;
    out[k] = complete > 0 ? sums[k] / (complete + k) : NaN;
  }
  if (type === 'covariance') return out;

  const c0 = out[0];
  if (!(c0 > 0)) throw new AnalysisInputError(`${fn}: the series is constant, so its autocorrelation is undefined`, { reason: 'constant' });
  for (let k = 0; k <= maxLag; k++) {
    const r = out[k] / c0;
    out[k] = r > 1 ? 1 : r < -1 ? -1 : r;
  }
  return out;
}
