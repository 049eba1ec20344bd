import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { armaArToPacf } from './arma-ar-to-pacf.ts';
import { armaConditionalSumOfSquares } from './arma-conditional-sum-of-squares.ts';
import { armaInvertMa } from './arma-invert-ma.ts';
import { armaLinearSolve } from './arma-linear-solve.ts';
import { armaPacfToAr } from './arma-pacf-to-ar.ts';
import { bfgsMinimize } from './bfgs-minimize.ts';
import { integerOption } from './integer-option.ts';
import { kalmanArmaLikelihood } from './kalman-arma-likelihood.ts';
import { numericalHessian } from './numerical-hessian.ts';

/** Highest AR or MA order `fitArma` accepts. */
const MAX_ORDER = 5;

/** R's `optim` default relative tolerance, √(double epsilon) ≈ 1.49e-8, which `arima` keeps. */
const R_RELTOL = Math.sqrt(Number.EPSILON);

export interface FitArmaOptions {
  /** AR order, a whole number 0..5. */
  p: number;
  /** MA order, a whole number 0..5. */
  q: number;
  /** Estimate a mean (default true); false fixes it at 0. */
  includeMean?: boolean;
  /**
   * Further starting points for the optimiser besides its own two, e.g. a nested model's
   * estimates padded with zeros (what `selectArma` passes, so a larger model never ends below a
   * smaller one it contains). AR parts must be stationary (others are ignored); `ar`/`ma` are
   * padded with zeros or cut to p and q; a missing mean starts at the sample mean.
   */
  starts?: { ar: ArrayLike<number>; ma: ArrayLike<number>; mean?: number | null }[];
  /**
   * BFGS iterations allowed from each start (default 100, R's `optim` default `maxit` for its
   * derivative-based methods, which R's `arima` keeps); running out leaves `converged` false.
   */
  maxIterations?: number;
}

export interface FitArmaResult {
  /** φ_1..φ_p of (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}; always stationary. */
  ar: number[];
  /** θ_1..θ_q (R's sign convention: plus); always invertible. */
  ma: number[];
  /** μ, or null when includeMean is false. */
  mean: number | null;
  /**
   * From the observed information (numerical Hessian of −log L), as R's `sqrt(diag(vcov(fit)))`.
   * NaN where the Hessian is not positive definite there (a flat or boundary optimum).
   */
  standardErrors: { ar: number[]; ma: number[]; mean: number | null };
  /** Innovation variance σ² (maximum likelihood, divisor = number of values used), as R's `sigma2`. */
  sigma2: number;
  /** Exact Gaussian log-likelihood including its constant, as R's `logLik(arima(…))`. */
  logLik: number;
  /** −2 logLik + 2k, k = p + q + (mean ? 1 : 0) + 1 (σ² counted, as R). */
  aic: number;
  /** AIC + 2k(k + 1)/(n − k − 1) (Hurvich & Tsai 1989). */
  aicc: number;
  /** −2 logLik + k ln n. */
  bic: number;
  /** One-step innovations v_t / √F_t as R's `residuals(arima(…))` (NaN where x is missing). */
  residuals: Float64Array;
  /** False when the optimiser ran out of iterations; the best point found is returned then. */
  converged: boolean;
}

/** True for an array or typed array of numbers (what a start's `ar` / `ma` must be). */
function isArrayLike(v: unknown): v is ArrayLike<number> {
  return Array.isArray(v) || v instanceof Float64Array;
}

/** Fewest present values `fitArma` accepts for ARMA(p, q): 3·(p + q + 1) + 10. */
function minimumLength(p: number, q: number): number {
  return 3 * (p + q + 1) + 10;
}

/**
 * Fits an ARMA(p, q) model with an optional mean by exact Gaussian maximum likelihood, as R's
 * `arima(x, order = c(p, 0, q), method = "ML", include.mean)` does (R 4.2.2, stats):
 *
 * - likelihood: Kalman filter on the state-space form with the stationary initial covariance,
 *   σ² concentrated out (`kalmanArmaLikelihood`; Gardner, Harvey & Phillips 1980, Applied
 *   Statistics 29:311–322; Durbin & Koopman 2012, §7.2); missing values (NaN) are skipped by the
 *   filter, as R's, and n counts the present values;
 * - parameters: the AR part through partial autocorrelations, φ = DL(tanh u) (`armaPacfToAr`;
 *   Jones 1980, Technometrics 22:389–395; Monahan 1984), so every iterate is stationary; the MA
 *   part unconstrained and made invertible afterwards (`armaInvertMa`), as R's
 *   `transform.pars = TRUE` and `maInvert`;
 * - optimiser: BFGS with central-difference gradients (`bfgsMinimize`; Nocedal & Wright 2006,
 *   Alg. 6.1), the mean scaled by 10 × its naive standard error (R's `parscale`), run from two
 *   starts — the conditional-sum-of-squares estimates (`armaConditionalSumOfSquares`, R's
 *   "CSS-ML" start) and R's `method = "ML"` start (ARMA part zero, sample mean) — keeping the
 *   higher likelihood (without a usable CSS start: zeros and zeros with φ_1's partial
 *   autocorrelation at 0.5), and from any `starts` the caller adds;
 * - standard errors: the inverse of n × the numerical Hessian of the per-value objective in the
 *   optimiser's parameters (`numericalHessian`, as R's `optim(hessian = TRUE)`), carried to φ by
 *   the delta method with the Jacobian of the tanh/Durbin–Levinson map, as R (`ARIMA_Gradtrans`);
 * - logLik = −n/2·(ln 2π + 1 + ln σ̂²) − ½ Σ ln F_t, AIC and BIC with k = p + q + mean + 1,
 *   AICc = AIC + 2k(k + 1)/(n − k − 1) (Hurvich & Tsai 1989, Biometrika 76:297–307).
 *
 * Throws AnalysisInputError for a non-array, orders outside 0..5, an infinite value, fewer than
 * 3·(p + q + 1) + 10 present values, or a constant series. Never mutates x.
 *
 * Cost: per likelihood evaluation O(n·r) once the filter reaches its steady state
 * (r = max(p, q + 1)); a fit takes a few hundred evaluations plus 4k² for the Hessian.
 */
export function fitArma(x: Series, options: FitArmaOptions): FitArmaResult {
  const fn = 'fitArma';
  if (typeof x === 'string') throw new AnalysisInputError(`${fn}: the series must be an array of numbers`);
  assertSeries(x, fn);
  if (options == null || typeof options !== 'object') throw new AnalysisInputError(`${fn}: options { p, q } are required`);
  const p = integerOption(fn, 'p', options.p, 0, MAX_ORDER);
  const q = integerOption(fn, 'q', options.q, 0, MAX_ORDER);
  const includeMean = options.includeMean ?? true;
  if (typeof includeMean !== 'boolean') throw new AnalysisInputError(`${fn}: includeMean must be true or false (got ${String(includeMean)})`);
  const maxIterations = integerOption(fn, 'maxIterations', options.maxIterations ?? 100, 1, 100_000);
  const given = options.starts ?? [];
  if (!Array.isArray(given) || !given.every((g) => g != null && isArrayLike(g.ar) && isArrayLike(g.ma))) {
    throw new AnalysisInputError(`${fn}: starts must be a list of { ar, ma } coefficient arrays`);
  }

  const y = Float64Array.from(x as ArrayLike<number>);
  let used = 0;
  let sum = 0;
  let first = NaN;
  let varies = false;
  for (let i = 0; i < y.length; i++) {
    const v = y[i];
    if (Number.isNaN(v)) continue;
    if (!Number.isFinite(v)) throw new AnalysisInputError(`${fn}: the series holds an infinite value at index ${i}: remove it or mark it missing (NaN)`);
    if (used === 0) first = v;
    else if (v !== first) varies = true;
    used++;
    sum += v;
  }
  const needed = minimumLength(p, q);
  if (used < needed) {
    throw new AnalysisInputError(`${fn} needs at least ${needed} points for ARMA(${p},${q}) (got ${used}): choose a longer range or a lower order`, {
      reason: 'too-few-values',
      need: needed,
      got: used,
    });
  }
  if (!varies) {
    throw new AnalysisInputError(
      `${fn}: the series is constant (every value is ${first}), so no ARMA model can be fitted: choose a range where the readings vary`,
      { reason: 'constant' },
    );
  }

  const mean0 = includeMean ? sum / used : 0;
  let ss = 0;
  for (let i = 0; i < y.length; i++) if (!Number.isNaN(y[i])) ss += (y[i] - mean0) ** 2;
  const k = p + q + (includeMean ? 1 : 0);
  const scale = new Float64Array(k).fill(1);
  // R's parscale for a regression coefficient: 10 × its least-squares standard error.
  if (includeMean) scale[k - 1] = 10 * Math.sqrt(ss / (used - 1) / used);

  const phi = new Float64Array(p);
  const theta = new Float64Array(q);
  const meanOf = (v: ArrayLike<number>): number => (includeMean ? v[k - 1] : 0);

  // Starting values: conditional sum of squares in the untransformed parameters.
  const start = new Float64Array(k);
  if (includeMean) start[k - 1] = mean0;
  let cssStart = false;
  const css = armaConditionalSumOfSquares(y, p, q);
  const cssObjective = (v: Float64Array): number => css(v.subarray(0, p), v.subarray(p, p + q), meanOf(v));
  // No CSS start when its criterion is undefined at zero (gaps leave no complete residual).
  if (p + q > 0 && Number.isFinite(cssObjective(start))) {
    const cssFit = bfgsMinimize(cssObjective, start, { scale, relativeTolerance: 1e-8, maxIterations: 200 });
    const pacf = armaArToPacf(cssFit.x.subarray(0, p));
    // A PACF beyond tanh(5) = 0.9999 would start ML on the edge of stationarity: use zeros then.
    if (pacf && pacf.every((u) => Math.abs(u) < 5)) {
      start.set(pacf, 0);
      start.set(armaInvertMa(cssFit.x.subarray(p, p + q)), p);
      if (includeMean) start[k - 1] = cssFit.x[k - 1];
      cssStart = true;
    }
  }

  const likelihood = kalmanArmaLikelihood(y, p, q);
  /** ½ [ln(S/m) + Σ ln F_t / m] for optimiser parameters (u, θ, μ): −log L per value, up to constants. */
  const objective = (v: Float64Array): number => {
    armaPacfToAr(v.subarray(0, p), phi);
    for (let j = 0; j < q; j++) theta[j] = v[p + j];
    const sums = likelihood(phi, theta, meanOf(v));
    if (sums === null || sums.counted === 0 || !(sums.sumSquares > 0)) return Infinity;
    return 0.5 * (Math.log(sums.sumSquares / sums.counted) + sums.sumLogVariance / sums.counted);
  };

  let best: Float64Array = start;
  let converged = true;
  if (k > 0) {
    // Two starts: the CSS estimates and R's own `method = "ML"` start (ARMA part zero, sample
    // mean); the higher likelihood wins. With p + q ≥ 2 the likelihood surface often has
    // several local maxima, and either start alone misses the global one on some series.
    // Without a CSS start (it failed, or gaps leave no complete residual), a second start has
    // φ_1's partial autocorrelation at 0.5: where only φ² is identified (e.g. every other value
    // missing) the likelihood is flat at φ = 0 and the zero start alone would stay there.
    const starts = [start];
    if (p + q > 0) {
      const zero = new Float64Array(k);
      if (includeMean) zero[k - 1] = mean0;
      if (cssStart) starts.push(zero);
      else if (p > 0) {
        const tilted = Float64Array.from(zero);
        tilted[0] = Math.atanh(0.5);
        starts.push(tilted);
      }
    }
    for (const extra of given) {
      const padded = (v: ArrayLike<number>, m: number) => Array.from({ length: m }, (_, i) => (i < v.length ? Number(v[i]) : 0));
      const pacf = armaArToPacf(padded(extra.ar, p));
      const ma = padded(extra.ma, q);
      if (!pacf || !pacf.every(Number.isFinite) || !ma.every(Number.isFinite)) continue;
      const from = new Float64Array(k);
      from.set(pacf, 0);
      from.set(ma, p);
      if (includeMean) from[k - 1] = typeof extra.mean === 'number' && Number.isFinite(extra.mean) ? extra.mean : mean0;
      starts.push(from);
    }
    let bestValue = Infinity;
    for (const from of starts) {
      if (!Number.isFinite(objective(from))) continue; // a start with θ = 0 always is finite
      const fit = bfgsMinimize(objective, from, { scale, maxIterations, relativeTolerance: R_RELTOL });
      if (fit.value < bestValue) {
        bestValue = fit.value;
        best = fit.x;
        converged = fit.converged;
      }
    }
    // MA invertibility, then (as R) the Hessian at the inverted point.
    const inverted = armaInvertMa(best.subarray(p, p + q));
    for (let j = 0; j < q; j++) best[p + j] = inverted[j];
  }

  const steps = Float64Array.from(scale, (s) => 1e-3 * s);
  const covariance = k > 0 ? inverseInformation(numericalHessian(objective, best, steps), k, used) : null;
  const se = (i: number): number => {
    const v = covariance ? covariance[i * k + i] : NaN;
    return v > 0 ? Math.sqrt(v) : NaN;
  };
  const arSe = arStandardErrors(best.subarray(0, p), covariance, k);

  const residuals = new Float64Array(y.length);
  armaPacfToAr(best.subarray(0, p), phi);
  for (let j = 0; j < q; j++) theta[j] = best[p + j];
  const sums = likelihood(phi, theta, meanOf(best), residuals);
  if (sums === null) throw new Error('fitArma: the fitted AR part is not stationary (internal error)');
  const sigma2 = sums.sumSquares / used;
  const value = 0.5 * (Math.log(sums.sumSquares / sums.counted) + sums.sumLogVariance / sums.counted);
  const logLik = -0.5 * (2 * used * value + used + used * Math.log(2 * Math.PI));
  const kAll = k + 1;
  const aic = -2 * logLik + 2 * kAll;
  return {
    ar: Array.from(phi),
    ma: Array.from(theta),
    mean: includeMean ? best[k - 1] : null,
    standardErrors: {
      ar: arSe,
      ma: Array.from({ length: q }, (_, j) => se(p + j)),
      mean: includeMean ? se(k - 1) : null,
    },
    sigma2,
    logLik,
    aic,
    aicc: aic + (2 * kAll * (kAll + 1)) / (used - kAll - 1),
    bic: -2 * logLik + kAll * Math.log(used),
    residuals,
    converged,
  };
}

/** (n·H)⁻¹ for the per-value Hessian H, or null when it is singular or not finite. */
function inverseInformation(hessian: Float64Array, k: number, n: number): Float64Array | null {
  if (hessian.some((v) => !Number.isFinite(v))) return null;
  const a = Float64Array.from(hessian, (v) => v * n);
  const b = new Float64Array(k * k);
  for (let i = 0; i < k; i++) b[i * k + i] = 1;
  return armaLinearSolve(a, b, k, k) ? b : null;
}

/**
 * Standard errors of φ = DL(tanh u) by the delta method, Var φ = J Var(u) Jᵀ with J = ∂φ/∂u by
 * central differences (R's `ARIMA_Gradtrans` uses forward differences of the same map).
 */
function arStandardErrors(u: Float64Array, covariance: Float64Array | null, k: number): number[] {
  const p = u.length;
  if (p === 0) return [];
  if (!covariance) return new Array(p).fill(NaN);
  const h = 1e-6;
  const jacobian = new Float64Array(p * p); // jacobian[i·p + j] = ∂φ_i/∂u_j
  const w = Float64Array.from(u);
  for (let j = 0; j < p; j++) {
    w[j] = u[j] + h;
    const up = armaPacfToAr(w);
    w[j] = u[j] - h;
    const down = armaPacfToAr(w);
    w[j] = u[j];
    for (let i = 0; i < p; i++) jacobian[i * p + j] = (up[i] - down[i]) / (2 * h);
  }
  const out: number[] = [];
  for (let i = 0; i < p; i++) {
    let v = 0;
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) v += jacobian[i * p + a] * jacobian[i * p + b] * covariance[a * k + b];
    out.push(v > 0 ? Math.sqrt(v) : NaN);
  }
  return out;
}
