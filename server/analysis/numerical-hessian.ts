/**
 * Hessian of f at x by central differences of a central-difference gradient,
 * H_ij ≈ [g_j(x + h_i e_i) − g_j(x − h_i e_i)] / (2 h_i), g_j(z) ≈ [f(z + h_j e_j) − f(z − h_j e_j)] / (2 h_j),
 * symmetrised as (H + Hᵀ)/2 (Nocedal & Wright, *Numerical Optimization*, 2nd ed., §8.1,
 * eqs. 8.7 and 8.20). This is how R's `optim(…, hessian = TRUE)` (`optimhess`) obtains the
 * observed information that `arima` inverts for its standard errors; `steps` plays the role of
 * R's `ndeps × parscale`.
 *
 * Returns the k × k matrix row-major; an entry is NaN when f is not finite at a needed point.
 * Cost: 4k² evaluations of f.
 */
export function numericalHessian(f: (x: Float64Array) => number, x: ArrayLike<number>, steps: ArrayLike<number>): Float64Array {
  const k = x.length;
  const z = Float64Array.from(x);
  const up = new Float64Array(k);
  const down = new Float64Array(k);
  const gradient = (out: Float64Array): void => {
    for (let j = 0; j < k; j++) {
      const keep = z[j];
      z[j] = keep + steps[j];
      const a = f(z);
      z[j] = keep - steps[j];
      const b = f(z);
      z[j] = keep;
      out[j] = (a - b) / (2 * steps[j]);
    }
  };
  const hessian = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    const keep = z[i];
    z[i] = keep + steps[i];
    gradient(up);
    z[i] = keep - steps[i];
    gradient(down);
    z[i] = keep;
    for (let j = 0; j < k; j++) hessian[i * k + j] = (up[j] - down[j]) / (2 * steps[i]);
  }
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < i; j++) {
      const m = (hessian[i * k + j] + hessian[j * k + i]) / 2;
      hessian[i * k + j] = m;
      hessian[j * k + i] = m;
    }
  }
  for (let i = 0; i < k * k; i++) if (!Number.isFinite(hessian[i])) hessian[i] = NaN;
  return hessian;
}
