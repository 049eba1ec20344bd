import { AnalysisInputError, type Series, presentValues } from './analysis-input-error.ts';
import { autocorrelation } from './autocorrelation.ts';
import { durbinLevinson } from './durbin-levinson.ts';
import { integerOption } from './integer-option.ts';

export interface ArYuleWalkerOptions {
  /** Highest order considered; defaults to R's min(n − 1, ⌊10·log10(n)⌋) with n non-missing values. */
  maxOrder?: number;
  /** Choose the order by AIC (default true); false fits exactly maxOrder. */
  aic?: boolean;
}

export interface ArYuleWalkerResult {
  /** The chosen order p (0 means the series is best described by its mean alone). */
  order: number;
  /** φ_1 … φ_p of x_t − μ = Σ φ_j (x_{t−j} − μ) + e_t. */
  coefficients: Float64Array;
  /**
   * Innovation variance as R's `ar.yw` reports it (`var.pred`): the Durbin–Levinson prediction
   * error variance v_p from autocovariances with divisor n, scaled by n / (n − (p + 1)).
   */
  variance: number;
  /**
   * AIC for orders 0..maxOrder relative to the minimum (so the chosen order has 0), as R's `$aic`:
   * n·ln v_m + 2m + 2 before the minimum is subtracted (the 2 counts the fitted mean).
   */
  aic: Float64Array;
  /** Mean removed before fitting. */
  mean: number;
}

/**
 * Autoregressive model fitted by the Yule–Walker equations, with the order chosen by Akaike's
 * information criterion, as R's `ar(x, method = "yule-walker")` does.
 *
 * The sample autocovariances (divisor n) are solved for every order 1..maxOrder by the
 * Durbin–Levinson recursion (Brockwell & Davis, *Introduction to Time Series and Forecasting*,
 * 2nd ed., §5.1.1; Box, Jenkins & Reinsel, *Time Series Analysis*, 4th ed., §7.3.1);
 * AIC_m = n ln v_m + 2m (+2 for the mean) (Akaike 1974, IEEE Trans. Automat. Control
 * 19:716–723). Missing values follow R's na.pass rule in the autocovariances; n counts the
 * present values.
 *
 * Cost: O(n · maxOrder) for the autocovariances plus O(maxOrder²).
 */
export function arYuleWalker(x: Series, options: ArYuleWalkerOptions = {}): ArYuleWalkerResult {
  const fn = 'arYuleWalker';
  const { n, sum } = presentValues(x, fn);
  if (n < 3) throw new AnalysisInputError(`${fn} requires at least 3 data points (got ${n})`, { reason: 'too-few-values', need: 3, got: n });
  const maxOrder = integerOption(fn, 'maxOrder', options.maxOrder ?? Math.min(n - 1, Math.floor(10 * Math.log10(n))), 1, Math.min(n - 2, x.length - 1));
  const gamma = autocorrelation(x, { maxLag: maxOrder, type: 'covariance' });
  if (gamma[0] === 0) throw new AnalysisInputError(`${fn}: the series is constant, so no model can be fitted`, { reason: 'constant' });
  const { coefficients, variances } = durbinLevinson(gamma, maxOrder);

  const aic = new Float64Array(maxOrder + 1);
  let best = 0;
  for (let m = 0; m <= maxOrder; m++) {
    aic[m] = n * Math.log(variances[m]) + 2 * m + 2;
    if (aic[m] < aic[best]) best = m;
  }
  const minimum = aic[best];
  for (let m = 0; m <= maxOrder; m++) aic[m] -= minimum;

  const order = options.aic === false ? maxOrder : best;
  return {
    order,
    coefficients: order ? Float64Array.from(coefficients[order - 1]) : new Float64Array(0),
    variance: (variances[order] * n) / (n - (order + 1)),
    aic,
    mean: sum / n,
  };
}
