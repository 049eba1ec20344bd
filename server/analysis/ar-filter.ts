/**
 * Applies the autoregressive filter of a fitted AR(p) model to a series:
 * e_t = (x_t − μ) − Σ_{i=1}^{p} φ_i (x_{t−i} − μ), the one-sided convolution
 * R computes as `filter(x - mu, c(1, -phi), sides = 1)` (R Core Team, `stats::filter`,
 * method "convolution"). The first p values have no complete past and are missing (NaN), and
 * a missing reading makes the p + 1 outputs that use it missing, as in R.
 *
 * Used to prewhiten a pair of series before cross-correlating them (Box, Jenkins, Reinsel &
 * Ljung, *Time Series Analysis*, 5th ed., 2015, §12.2.2). Never mutates its input.
 *
 * Cost: O(n · p).
 */
export function arFilter(x: ArrayLike<number>, coefficients: ArrayLike<number>, mean: number): Float64Array {
  const n = x.length;
  const p = coefficients.length;
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    if (t < p) {
      out[t] = NaN;
      continue;
    }
    let v = x[t] - mean;
    for (let i = 1; i <= p; i++) v -= coefficients[i - 1] * (x[t - i] - mean);
    out[t] = v; // NaN when any reading it uses is missing
  }
  return out;
}
