import { AnalysisInputError, type Series, presentValues } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { normalQuantile } from './normal-quantile.ts';

export interface EffectiveSampleSizeOptions {
  /** 1 − confidence level of the interval for the mean (default 0.05). */
  alpha?: number;
  /**
   * The sample ACF of this same series at lags 0..K (as `acf` returns it), when the caller already
   * has it: used as long as the initial monotone sequence ends within it.
   */
  acf?: Float64Array;
}

export interface EffectiveSampleSizeResult {
  /** Non-missing values. */
  n: number;
  /** n / τ: how many independent readings would pin the mean down as well. */
  ess: number;
  /** Integrated autocorrelation time τ = 1 + 2 Σ_{k≥1} ρ_k, as estimated. */
  tau: number;
  /** Highest lag that entered the sum. */
  lagsUsed: number;
  mean: number;
  /** √(s² τ / n), s² the sample variance (divisor n − 1): the standard error of the mean. */
  standardError: number;
  /** mean ∓ z(1 − α/2) · standardError. */
  confidenceInterval: [number, number];
  alpha: number;
}

/**
 * Effective sample size of a channel: n corrected for autocorrelation, n / (1 + 2 Σ_{k≥1} ρ_k),
 * with the standard error and a normal confidence interval of the mean that it implies. With
 * positively correlated readings this is far below n, and an ordinary t-test or confidence
 * interval that uses n is too optimistic (Brockwell & Davis, *Introduction to Time Series and
 * Forecasting*, 2nd ed., §2.4.1: Var(x̄) ≈ n⁻¹ Σ_h γ(h)).
 *
 * The infinite sum is truncated by Geyer's initial monotone sequence estimator (Geyer 1992,
 * Statistical Science 7:473–483, §3.3): sums of adjacent pairs Γ_m = ρ_{2m} + ρ_{2m+1} are
 * added while they stay positive, each capped by the previous one, and τ = −1 + 2 Σ Γ_m.
 * Strongly alternating series can make τ tiny; as is common practice the result is capped at
 * ess ≤ n·log10(n). Missing values follow the na.pass rule of `acf`.
 *
 * Cost: O(n log n) time (the ACF is extended fourfold until the sequence ends; an ACF passed in
 * `options.acf` is read first).
 */
export function effectiveSampleSize(x: Series, options: EffectiveSampleSizeOptions = {}): EffectiveSampleSizeResult {
  const fn = 'effectiveSampleSize';
  const { n, sum } = presentValues(x, fn);
  if (n < 4) throw new AnalysisInputError(`${fn} requires at least 4 data points (got ${n})`, { reason: 'too-few-values', need: 4, got: n });
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  const mean = sum / n;
  let squares = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) squares += (x[i] - mean) ** 2;
  const variance = squares / (n - 1);
  if (!(variance > 0)) throw new AnalysisInputError(`${fn}: the series is constant, so its sample size cannot be corrected`, { reason: 'constant' });

  const given = options.acf;
  let maxLag = given ? Math.min(x.length - 1, given.length - 1) : Math.min(x.length - 1, 128);
  for (let round = 0; ; round++) {
    const r = round === 0 && given ? given : autocorrelation(x, { maxLag });
    let total = 0;
    let previous = Infinity;
    let m = 0;
    let ended = false;
    for (; 2 * m + 1 <= maxLag; m++) {
      const a = Number.isNaN(r[2 * m]) ? 0 : r[2 * m];
      const b = Number.isNaN(r[2 * m + 1]) ? 0 : r[2 * m + 1];
      const pair = Math.min(a + b, previous);
      if (pair <= 0) {
        ended = true;
        break;
      }
      total += pair;
      previous = pair;
    }
    if (ended || maxLag === x.length - 1) {
      const tau = Math.max(-1 + 2 * total, 1 / Math.log10(Math.max(n, 10)));
      const ess = n / tau;
      const standardError = Math.sqrt((variance * tau) / n);
      const z = normalQuantile(1 - alpha / 2);
      return {
        n,
        ess,
        tau,
        lagsUsed: Math.max(0, 2 * m - 1),
        mean,
        standardError,
        confidenceInterval: [mean - z * standardError, mean + z * standardError],
        alpha,
      };
    }
    maxLag = Math.min(x.length - 1, Math.max(128, maxLag * 4));
  }
}
