/**
 * Prepares the conditional-sum-of-squares criterion of ARMA(p, q) models for one series and
 * returns an evaluator of ½·ln(S/m), S = Σ e_t² over t ≥ p, where
 * e_t = (y_t − μ) − Σ φ_i (y_{t−i} − μ) − Σ θ_j e_{t−j} with the first p residuals and the
 * pre-sample shocks set to zero (Box, Jenkins, Reinsel & Ljung, *Time Series Analysis*, 5th
 * ed., §7.1.2, the conditional likelihood; R's `arima(method = "CSS")`, `ARIMA_CSS`, which uses
 * the same conditioning). Minimising it gives the quick starting values R's default
 * "CSS-ML" fit hands to exact maximum likelihood.
 *
 * A missing value makes the residuals that need it missing: they are left out of S and treated
 * as zero in later MA terms. Returns Infinity when no residual is left.
 * Allocation-free per evaluation. Cost: O(n·(p + q)).
 */
export function armaConditionalSumOfSquares(y: Float64Array, p: number, q: number): (phi: ArrayLike<number>, theta: ArrayLike<number>, mean: number) => number {
  const n = y.length;
  const resid = new Float64Array(n);
  return (phi, theta, mean) => {
    let ssq = 0;
    let m = 0;
    for (let t = p; t < n; t++) {
      let e = y[t] - mean;
      for (let i = 0; i < p; i++) e -= phi[i] * (y[t - i - 1] - mean);
      const lags = Math.min(t - p, q);
      for (let j = 0; j < lags; j++) e -= theta[j] * resid[t - j - 1];
      if (e === e) {
        resid[t] = e;
        ssq += e * e;
        m++;
      } else resid[t] = 0;
    }
    return m > 0 && ssq > 0 ? 0.5 * Math.log(ssq / m) : Infinity;
  };
}
