/**
 * Residuals from the least-squares straight line through the present values, x_t − (a + b·t)
 * (ordinary least squares, e.g. Brockwell & Davis, *Introduction to Time Series and
 * Forecasting*, 2nd ed., §1.5.1). A steady drift otherwise dominates both the ACF and the
 * low frequencies of the periodogram and hides a cycle. NaN stays NaN; the input is not changed.
 *
 * Cost: O(n).
 */
export function removeLinearTrend(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  let count = 0;
  let sumT = 0;
  let sumX = 0;
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(x[t])) continue;
    count++;
    sumT += t;
    sumX += x[t];
  }
  const meanT = count ? sumT / count : 0;
  const meanX = count ? sumX / count : 0;
  let sxy = 0;
  let sxx = 0;
  for (let t = 0; t < n; t++) {
    if (Number.isNaN(x[t])) continue;
    sxy += (t - meanT) * (x[t] - meanX);
    sxx += (t - meanT) * (t - meanT);
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) out[t] = x[t] - meanX - slope * (t - meanT);
  return out;
}
