/**
 * Autocorrelations ρ(0..maxLag) of a causal AR(p) model whose first p autocorrelations are
 * `start` (ρ(1..p); ρ(0) = 1), continued by the difference equation ρ(h) = Σ_j φ_j ρ(h − j)
 * for h > p (Brockwell & Davis, *Introduction to Time Series and Forecasting*, 2nd ed., §3.2.1).
 * For a Yule–Walker fit the first p values are the sample autocorrelations it was fitted to,
 * so the model reproduces them exactly. Once p consecutive values are below 1e-9 in size the
 * rest are set to zero (a stationary model's ACF decays geometrically).
 *
 * Cost: O(maxLag · p) time at most, O(maxLag) space.
 */
export function arAutocorrelations(coefficients: ArrayLike<number>, start: ArrayLike<number>, maxLag: number): Float64Array {
  const p = coefficients.length;
  const rho = new Float64Array(maxLag + 1);
  rho[0] = 1;
  for (let h = 1; h <= Math.min(p, maxLag); h++) rho[h] = start[h - 1];
  let quiet = 0;
  for (let h = p + 1; h <= maxLag; h++) {
    let v = 0;
    for (let j = 1; j <= p; j++) v += coefficients[j - 1] * rho[h - j];
    rho[h] = v;
    quiet = Math.abs(v) < 1e-9 ? quiet + 1 : 0;
    if (p === 0 || quiet >= p) break;
  }
  return rho;
}
