/**
 * Lagged product sums by direct summation: for every lag k in 0..maxLag,
 * `out[k] = Σ_{i=0}^{n-k-1} a[i + k] · b[i]`.
 *
 * This is the numerator of the sample autocovariance (Box, Jenkins & Reinsel, *Time Series
 * Analysis*, 4th ed., eq. 2.1.12) before division. Missing values must already be zeros.
 * When `a` and `b` are the same array the loop reads one array only. Four lags are summed per
 * pass so each loaded value is reused four times, which keeps the loop memory-light.
 *
 * Cost: O(n · maxLag) time, O(maxLag) extra space.
 */
export function laggedProductsDirect(a: Float64Array, b: Float64Array, maxLag: number): Float64Array {
  const n = Math.min(a.length, b.length);
  const out = new Float64Array(maxLag + 1);
  let k = 0;
  for (; k + 3 <= maxLag; k += 4) {
    const end = n - k - 3;
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let i = 0; i < end; i++) {
      const bi = b[i];
      s0 += a[i + k] * bi;
      s1 += a[i + k + 1] * bi;
      s2 += a[i + k + 2] * bi;
      s3 += a[i + k + 3] * bi;
    }
    // The last three values of b pair with fewer lags of the block.
    for (let i = Math.max(end, 0); i < n - k; i++) {
      const bi = b[i];
      s0 += a[i + k] * bi;
      if (i + k + 1 < n) s1 += a[i + k + 1] * bi;
      if (i + k + 2 < n) s2 += a[i + k + 2] * bi;
    }
    out[k] = s0;
    out[k + 1] = s1;
    out[k + 2] = s2;
    out[k + 3] = s3;
  }
  for (; k <= maxLag; k++) {
    let s = 0;
    for (let i = 0; i < n - k; i++) s += a[i + k] * b[i];
    out[k] = s;
  }
  return out;
}
