import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { integerOption } from './integer-option.ts';
import { normalQuantile } from './normal-quantile.ts';

export interface AutocorrelationBandsOptions {
  /**
   * Length of the series the ACF came from. When given, the first argument is an ACF at lags
   * 0..K (as `acf` returns it); when omitted, the first argument is the series itself.
   */
  n?: number;
  /** Highest lag when the first argument is the series (default as `acf`). */
  maxLag?: number;
  /** 1 − confidence level (default 0.05, R's ci = 0.95). */
  alpha?: number;
  /** 'white-noise': ±z/√n; 'bartlett': ±z·√((1 + 2 Σ_{j<k} r_j²)/n). */
  kind: 'white-noise' | 'bartlett';
}

export interface AutocorrelationBands {
  kind: 'white-noise' | 'bartlett';
  alpha: number;
  /** z(1 − α/2). */
  z: number;
  /** Lags 1..K. */
  lags: Int32Array;
  /** Half-width of the band at each lag in `lags`: a lag is significant when |r_k| > limit. */
  limits: Float64Array;
}

/**
 * Confidence bands for a sample ACF, the dashed lines of a correlogram:
 * - 'white-noise': ±z(1 − α/2)/√n, the approximate distribution of r_k for independent data
 *   (Bartlett 1946, J. R. Statist. Soc. Suppl. 8:27–41; Brockwell & Davis, *Introduction to Time
 *   Series and Forecasting*, 2nd ed., §1.4.1) — R's `plot.acf(ci.type = "white")`;
 * - 'bartlett': ±z·√((1 + 2 Σ_{j=1}^{k−1} r_j²)/n) at lag k, the large-lag variance of r_k when the
 *   process is MA(k − 1) (Bartlett's formula; Box, Jenkins & Reinsel, *Time Series Analysis*,
 *   4th ed., eq. 2.1.15) — R's `plot.acf(ci.type = "ma")`, the band for judging where an ACF
 *   cuts off.
 *
 * Cost: O(K) given the ACF, plus the ACF itself when a series is passed.
 */
export function autocorrelationBands(xOrAcf: Series, options: AutocorrelationBandsOptions): AutocorrelationBands {
  const fn = 'acfBands';
  if (xOrAcf == null || typeof xOrAcf.length !== 'number') {
    throw new AnalysisInputError(`${fn}: the first argument must be an array of numbers`);
  }
  const { kind, alpha = 0.05 } = options ?? ({} as AutocorrelationBandsOptions);
  if (kind !== 'white-noise' && kind !== 'bartlett') {
    throw new AnalysisInputError(`${fn}: kind must be 'white-noise' or 'bartlett' (got ${String(kind)})`);
  }
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  let r: ArrayLike<number>;
  let n: number;
  if (options.n === undefined) {
    r = autocorrelation(xOrAcf, { maxLag: options.maxLag });
    n = 0;
    for (let i = 0; i < xOrAcf.length; i++) if (!Number.isNaN(xOrAcf[i])) n++;
  } else {
    n = integerOption(fn, 'n', options.n, 1);
    r = xOrAcf;
    if (r.length < 2) throw new AnalysisInputError(`${fn} requires an ACF with at least lags 0 and 1 (got ${r.length} values)`);
  }
  const z = normalQuantile(1 - alpha / 2);
  const maxLag = r.length - 1;
  const lags = new Int32Array(maxLag);
  const limits = new Float64Array(maxLag);
  let cumulative = 1;
  for (let k = 1; k <= maxLag; k++) {
    lags[k - 1] = k;
    limits[k - 1] = (z * Math.sqrt(kind === 'bartlett' ? cumulative : 1)) / Math.sqrt(n);
    cumulative += 2 * r[k] * r[k];
  }
  return { kind, alpha, z, lags, limits };
}
