/**
 * Maps unconstrained reals u_1..u_p to the coefficients φ_1..φ_p of a stationary AR(p)
 * polynomial: each u_k becomes a partial autocorrelation r_k = tanh(u_k) in (−1, 1), and the
 * Durbin–Levinson step φ_kj = φ_{k−1,j} − r_k φ_{k−1,k−j}, φ_kk = r_k builds the coefficients
 * of order k from those of order k − 1 (Barndorff-Nielsen & Schou 1973, J. Multivariate Anal.
 * 3:408–419; Jones 1980, Technometrics 22:389–395, §3; Monahan 1984, Biometrika 71:403–404).
 * Every point of R^p gives a stationary AR part, so the likelihood can be maximised without
 * constraints. R's `arima(transform.pars = TRUE)` uses the same map. The sign convention is the
 * recursion's: the reflection coefficient enters as φ_kk = r_k, φ_kj −= r_k φ_{k−1,k−j}.
 *
 * Writes into `out` (length p) when given, else into a new array. Cost: O(p²).
 */
export function armaPacfToAr(u: ArrayLike<number>, out: Float64Array = new Float64Array(u.length)): Float64Array {
  const p = u.length;
  for (let k = 0; k < p; k++) out[k] = Math.tanh(u[k]);
  // out[0..k−1] hold order-k coefficients; out[k..] still hold the raw partial correlations.
  for (let k = 1; k < p; k++) {
    const r = out[k];
    let low = 0;
    let high = k - 1;
    for (; low < high; low++, high--) {
      const a = out[low];
      const b = out[high];
      out[low] = a - r * b;
      out[high] = b - r * a;
    }
    if (low === high) out[low] -= r * out[low];
  }
  return out;
}
