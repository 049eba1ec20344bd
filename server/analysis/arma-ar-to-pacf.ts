/**
 * Inverse of `armaPacfToAr`: runs the Durbin–Levinson recursion backwards from AR coefficients
 * φ_1..φ_p to the partial autocorrelations r_1..r_p, φ_{k−1,j} = (φ_kj + r_k φ_{k,k−j}) / (1 − r_k²)
 * with r_k = φ_kk, and returns atanh(r_k), the unconstrained parameters R's
 * `arima(transform.pars = TRUE)` optimises (Jones 1980, Technometrics 22:389–395, §3;
 * Monahan 1984, Biometrika 71:403–404).
 *
 * Returns null when some |r_k| ≥ 1: by the Schur–Cohn criterion that happens exactly when
 * 1 − φ_1 z − … − φ_p z^p has a root on or inside the unit circle, i.e. the AR part is not
 * stationary (Brockwell & Davis, *Time Series: Theory and Methods*, 2nd ed., §8.2 and §3.1), so
 * this is also the engine's stationarity check. Cost: O(p²).
 */
export function armaArToPacf(phi: ArrayLike<number>): Float64Array | null {
  const p = phi.length;
  const work = Float64Array.from(phi);
  const out = new Float64Array(p);
  for (let k = p - 1; k >= 0; k--) {
    const r = work[k];
    if (!(Math.abs(r) < 1)) return null;
    out[k] = Math.atanh(r);
    const denominator = 1 - r * r;
    let low = 0;
    let high = k - 1;
    for (; low < high; low++, high--) {
      const a = work[low];
      const b = work[high];
      work[low] = (a + r * b) / denominator;
      work[high] = (b + r * a) / denominator;
    }
    if (low === high) work[low] = (work[low] + r * work[low]) / denominator;
  }
  return out;
}
