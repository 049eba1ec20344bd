/** Options of `bfgsMinimize`. */
export interface BfgsOptions {
  /** Typical size of each parameter: the search runs on x / scale (R's `parscale`). Default 1 each. */
  scale?: ArrayLike<number>;
  /** Step of the central-difference gradient on the scaled parameters (R's `ndeps`). Default 1e-3. */
  gradientStep?: number;
  /** Stop when an iteration lowers f by less than relativeTolerance·(|f| + relativeTolerance). Default 1e-10. */
  relativeTolerance?: number;
  /** Most iterations (gradient evaluations) before giving up. Default 500. */
  maxIterations?: number;
}

/** Result of `bfgsMinimize`. */
export interface BfgsResult {
  /** Best point found (unscaled). */
  x: Float64Array;
  /** f at x. */
  value: number;
  /** True when the stopping rule was met; false when maxIterations ran out. */
  converged: boolean;
  iterations: number;
  evaluations: number;
}

/**
 * Unconstrained minimisation by the BFGS quasi-Newton method with an inverse-Hessian update
 * (Nocedal & Wright, *Numerical Optimization*, 2nd ed., Algorithm 6.1, update eq. 6.17) and a
 * backtracking Armijo line search (N&W Algorithm 3.1, c₁ = 1e-4, contraction 0.2), gradients
 * by central differences (N&W §8.1, eq. 8.7) on the scaled parameters. The inverse Hessian is
 * reset to the identity whenever the curvature condition sᵀy > 0 fails or the search direction
 * is not downhill, as in Nash's variable-metric code behind R's `optim(method = "BFGS")`
 * (Nash, *Compact Numerical Methods for Computers*, 2nd ed., 1990, Algorithm 21); convergence
 * is the same relative-decrease test as R's (`reltol`), but only accepted after a full step or
 * right after a reset, so a short step that made little progress does not end the search.
 *
 * f may return Infinity or NaN for an inadmissible point; the line search then shortens the
 * step. Cost: (2·k + line-search steps) evaluations of f per iteration, O(k²) algebra.
 */
export function bfgsMinimize(f: (x: Float64Array) => number, start: ArrayLike<number>, options: BfgsOptions = {}): BfgsResult {
  const k = start.length;
  const scale = Float64Array.from({ length: k }, (_, i) => options.scale?.[i] ?? 1);
  const h = options.gradientStep ?? 1e-3;
  const reltol = options.relativeTolerance ?? 1e-10;
  const maxIterations = options.maxIterations ?? 500;
  let evaluations = 0;
  const point = new Float64Array(k);
  /** f at scaled u. */
  const fs = (u: Float64Array): number => {
    for (let i = 0; i < k; i++) point[i] = u[i] * scale[i];
    evaluations++;
    const v = f(point);
    return Number.isNaN(v) ? Infinity : v;
  };
  const gradient = (u: Float64Array, g: Float64Array): void => {
    for (let i = 0; i < k; i++) {
      const keep = u[i];
      u[i] = keep + h;
      const up = fs(u);
      u[i] = keep - h;
      const down = fs(u);
      u[i] = keep;
      g[i] = (up - down) / (2 * h);
      if (!Number.isFinite(g[i])) g[i] = 0; // an edge of the admissible region: no information that way
    }
  };

  const u = Float64Array.from({ length: k }, (_, i) => start[i] / scale[i]);
  let value = fs(u);
  if (!Number.isFinite(value)) throw new Error('bfgsMinimize: f is not finite at the starting point');
  const g = new Float64Array(k);
  const gNew = new Float64Array(k);
  const dir = new Float64Array(k);
  const trial = new Float64Array(k);
  const s = new Float64Array(k);
  const yv = new Float64Array(k);
  const hy = new Float64Array(k);
  const inv = new Float64Array(k * k);
  const reset = (): void => {
    inv.fill(0);
    for (let i = 0; i < k; i++) inv[i * k + i] = 1;
  };
  reset();
  gradient(u, g);
  let justReset = true;
  let iterations = 1;
  let converged = false;

  while (iterations < maxIterations) {
    let slope = 0;
    for (let i = 0; i < k; i++) {
      let d = 0;
      for (let j = 0; j < k; j++) d -= inv[i * k + j] * g[j];
      dir[i] = d;
      slope += d * g[i];
    }
    if (!(slope < 0)) {
      if (justReset) {
        converged = true; // steepest descent is not downhill: a stationary point to gradient precision
        break;
      }
      reset();
      justReset = true;
      continue;
    }
    let step = 1;
    let accepted = false;
    let trialValue = value;
    for (;;) {
      let unchanged = 0;
      for (let i = 0; i < k; i++) {
        trial[i] = u[i] + step * dir[i];
        if (10 + trial[i] === 10 + u[i]) unchanged++;
      }
      if (unchanged === k) break;
      trialValue = fs(trial);
      if (Number.isFinite(trialValue) && trialValue <= value + 1e-4 * step * slope) {
        accepted = true;
        break;
      }
      step *= 0.2;
    }
    if (!accepted) {
      if (justReset) {
        converged = true; // no descent possible along the gradient at working precision
        break;
      }
      reset();
      justReset = true;
      continue;
    }
    const small = Math.abs(value - trialValue) <= reltol * (Math.abs(value) + reltol);
    for (let i = 0; i < k; i++) {
      s[i] = trial[i] - u[i];
      u[i] = trial[i];
    }
    value = trialValue;
    if (small && (step === 1 || justReset)) {
      converged = true;
      break;
    }
    gradient(u, gNew);
    iterations++;
    let sy = 0;
    for (let i = 0; i < k; i++) {
      yv[i] = gNew[i] - g[i];
      sy += s[i] * yv[i];
      g[i] = gNew[i];
    }
    if (small || !(sy > 0)) {
      reset();
      justReset = true;
      continue;
    }
    // H ← (I − ρ s yᵀ) H (I − ρ y sᵀ) + ρ s sᵀ, with ρ = 1 / sᵀy (N&W eq. 6.17), expanded:
    // H + ρ²(yᵀHy) s sᵀ + ρ s sᵀ − ρ (H y sᵀ + s yᵀ H).
    let yhy = 0;
    for (let i = 0; i < k; i++) {
      let v = 0;
      for (let j = 0; j < k; j++) v += inv[i * k + j] * yv[j];
      hy[i] = v;
      yhy += yv[i] * v;
    }
    const rho = 1 / sy;
    const c = rho * rho * yhy + rho;
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) inv[i * k + j] += c * s[i] * s[j] - rho * (hy[i] * s[j] + s[i] * hy[j]);
    }
    justReset = false;
  }
  const x = Float64Array.from({ length: k }, (_, i) => u[i] * scale[i]);
  return { x, value, converged, iterations, evaluations };
}
