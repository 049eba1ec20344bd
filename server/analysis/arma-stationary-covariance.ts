import { armaLinearSolve } from './arma-linear-solve.ts';

/**
 * Covariance P0 of the state of a stationary ARMA(p, q) model with unit innovation variance in
 * the state-space form R's `arima` uses (r = max(p, q + 1); transition T with φ in its first
 * column and ones on the superdiagonal; disturbance loading R = (1, θ_1, …, θ_{r−1})′):
 * the solution of the discrete Lyapunov equation P0 = T P0 T′ + R R′ (Gardner, Harvey &
 * Phillips 1980, Applied Statistics 29:311–322, §2; Durbin & Koopman, *Time Series Analysis by
 * State Space Methods*, 2nd ed., §5.6.2). It is solved directly in vec form,
 * (I − T ⊗ T) vec P0 = vec(R R′) (Durbin & Koopman eq. 5.31) — the same matrix as R's
 * `makeARIMA(phi, theta, numeric())$Pn` (SSinit = "Gardner1980"); checked against R 4.2.2 to
 * 5e-16 on five ARMA models with p, q ≤ 3 while writing this.
 *
 * `phi`, `theta` are padded with zeros to r internally. Writes P0 (row-major r × r) into `out`
 * and returns true; returns false when the system is singular (an AR root on the unit circle).
 * `work` must hold r⁴ doubles. Cost: O(r⁶), r ≤ 6 here.
 */
export function armaStationaryCovariance(phi: ArrayLike<number>, theta: ArrayLike<number>, r: number, out: Float64Array, work: Float64Array): boolean {
  const m = r * r;
  const p = phi.length;
  const q = theta.length;
  // T_ik: φ_i in column 0, 1 on the superdiagonal.
  const t = (i: number, k: number): number => (k === 0 && i < p ? phi[i] : 0) + (k === i + 1 ? 1 : 0);
  const loading = (i: number): number => (i === 0 ? 1 : i - 1 < q ? theta[i - 1] : 0);
  work.fill(0, 0, m * m);
  for (let i = 0; i < r; i++) {
    for (let j = 0; j < r; j++) {
      const row = i * r + j;
      out[row] = loading(i) * loading(j);
      for (let k = 0; k < r; k++) {
        const tik = t(i, k);
        if (tik === 0) continue;
        for (let l = 0; l < r; l++) {
          const tjl = t(j, l);
          if (tjl !== 0) work[row * m + k * r + l] -= tik * tjl;
        }
      }
      work[row * m + row] += 1;
    }
  }
  return armaLinearSolve(work, out, m, 1);
}
