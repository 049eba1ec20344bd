import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { chiSquareUpperTail } from './chi-square-upper-tail.ts';
import { integerOption } from './integer-option.ts';

export interface PortmanteauOptions {
  /** Number of autocorrelations pooled into the statistic (h). */
  lag: number;
  /** Parameters fitted before the test (p + q for ARMA residuals); df = lag − fitdf. Default 0. */
  fitdf?: number;
  /**
   * The sample ACF of this same series at lags 0..K with K ≥ lag (as `acf` returns it), when the
   * caller already has it: the test then reads r_1..r_h from it instead of computing them again.
   */
  acf?: ArrayLike<number>;
}

export interface PortmanteauResult {
  statistic: number;
  df: number;
  pValue: number;
}

/**
 * Shared core of the Box–Pierce and Ljung–Box tests: pools the squared sample autocorrelations
 * r_1..r_h with per-lag weights w_k(n) into Q = Σ w_k r_k² and refers Q to χ²(h − fitdf).
 * n counts the non-missing values and r_k follows R's na.pass rule, as `stats::Box.test` does.
 * A caller holding the ACF already passes it as `options.acf`.
 *
 * Cost: O(n · h) time.
 */
export function portmanteauTest(fn: string, x: Series, options: PortmanteauOptions, weight: (n: number, k: number) => number): PortmanteauResult {
  assertSeries(x, fn);
  if (x.length < 3)
    throw new AnalysisInputError(`${fn} requires at least 3 data points (got ${x.length})`, { reason: 'too-few-values', need: 3, got: x.length });
  const lag = integerOption(fn, 'lag', options?.lag, 1, x.length - 1);
  const fitdf = integerOption(fn, 'fitdf', options.fitdf ?? 0, 0, lag - 1);
  let n = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) n++;
  if (options.acf !== undefined && options.acf.length <= lag) {
    throw new AnalysisInputError(`${fn}: the given acf stops at lag ${options.acf.length - 1}, below lag ${lag}`);
  }
  const r = options.acf ?? autocorrelation(x, { maxLag: lag });
  let statistic = 0;
  for (let k = 1; k <= lag; k++) statistic += weight(n, k) * r[k] * r[k];
  const df = lag - fitdf;
  return { statistic, df, pValue: chiSquareUpperTail(statistic, df) };
}
