import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { chiSquareUpperTail } from './chi-square-upper-tail.ts';
import { integerOption } from './integer-option.ts';
import { laggedProducts } from './lagged-products.ts';
import { normalQuantile } from './normal-quantile.ts';
import { studentTQuantile } from './student-t-quantile.ts';

/** Fewest non-missing readings a trend is tested on. */
const MIN_POINTS = 10;

export interface TrendTestOptions {
  /** Newey–West truncation lag L (Bartlett weights 1 − l/(L + 1)); default ⌊4 (n/100)^{2/9}⌋, n non-missing. */
  lag?: number;
  /** 1 − confidence level of both intervals (default 0.05). */
  alpha?: number;
}

export interface TrendTestResult {
  /** Least-squares slope per step of the series (per grid cell). */
  slope: number;
  /** Fitted value at t = 0, the line being x ≈ intercept + slope · t with t = 1 … n (R's lm(x ~ t), t = seq_along(x)). */
  intercept: number;
  /** Ordinary least-squares standard error of the slope, s/√Σ(t − t̄)², s² = RSS/(n − 2). */
  standardErrorOls: number;
  /** Newey–West (HAC) standard error of the slope. */
  standardErrorHac: number;
  /** Newey–West standard error of the intercept (at t = 0). */
  interceptStandardErrorHac: number;
  /** The truncation lag used. */
  lag: number;
  /** slope / standardErrorHac. */
  tHac: number;
  /** Two-sided p-value of slope = 0 from the standard normal distribution (asymptotic). */
  pValueHac: number;
  /** slope ∓ z(1 − α/2) · standardErrorHac. */
  interval: [number, number];
  /** The naive interval slope ∓ t(1 − α/2; n − 2) · standardErrorOls, R's confint(lm(x ~ t)). */
  intervalOls: [number, number];
  alpha: number;
  /** Readings the line was fitted to (NaN values are dropped, their t kept). */
  nonMissing: number;
}

/**
 * Linear trend test that respects autocorrelation: is the channel drifting, and how fast?
 *
 * Fits x_t = a + b·t + u_t by ordinary least squares with t = 1 … n (the position in the
 * series, so the slope is per step and a is the line's value at t = 0; R's `lm(x ~ t)` with
 * `t = seq_along(x)`). Missing readings (NaN) are dropped and the others keep their own t, as
 * `lm(x ~ t, na.action = na.omit)`; the Newey–West sums then run over the remaining readings in
 * order, as `sandwich` does on the omitted rows.
 *
 * The standard errors come from the heteroskedasticity- and autocorrelation-consistent
 * covariance of Newey & West (1987, Econometrica 55:703–708, eqs. 2–3): with ψ_t = u_t·(1, t)ᵀ,
 * V = (XᵀX)⁻¹ [Γ_0 + Σ_{l=1}^{L} (1 − l/(L + 1)) (Γ_l + Γ_lᵀ)] (XᵀX)⁻¹, Γ_l = Σ_t ψ_t ψ_{t−l}ᵀ,
 * which equals R's `sandwich::NeweyWest(fit, lag = L, prewhite = FALSE, adjust = FALSE)`
 * (Zeileis 2004, J. Stat. Softw. 11(10), §2). The default lag ⌊4 (n/100)^{2/9}⌋ is the usual
 * rule of thumb for the Bartlett kernel (Newey & West 1994, Rev. Econ. Stud. 61:631–653, as
 * their starting value; from memory); strongly persistent residuals want a longer lag. The
 * test of b = 0 is asymptotic: tHac is referred to the standard normal distribution (two-sided
 * p = P(χ²₁ > tHac²)). The naive OLS interval (Student t, n − 2 df) is given beside it so the
 * difference autocorrelation makes is visible. Internally t is centred at its mean, which
 * changes nothing but rounding.
 *
 * Throws AnalysisInputError for fewer than 10 readings, a bad lag or alpha, a constant series, or
 * readings lying exactly on a line (no sampling error to estimate).
 *
 * Cost: O(n · min(L, log n)): the lagged sums go through `laggedProducts` (direct or FFT).
 */
export function trendTest(x: Series, options: TrendTestOptions = {}): TrendTestResult {
  const fn = 'trendTest';
  assertSeries(x, fn);
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new AnalysisInputError(`${fn}: alpha must be between 0 and 1 (got ${alpha})`);
  let n = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i])) n++;
  if (n < MIN_POINTS)
    throw new AnalysisInputError(`${fn} requires at least ${MIN_POINTS} data points (got ${n})`, { reason: 'too-few-values', need: MIN_POINTS, got: n });
  const lag = integerOption(fn, 'lag', options.lag ?? Math.floor(4 * (n / 100) ** (2 / 9)), 0, n - 1);
  const times = new Float64Array(n);
  const values = new Float64Array(n);
  let constant = true;
  for (let i = 0, j = 0; i < x.length; i++) {
    if (Number.isNaN(x[i])) continue;
    times[j] = i + 1;
    values[j] = x[i];
    if (values[j] !== values[0]) constant = false;
    j++;
  }
  if (constant) throw new AnalysisInputError(`${fn}: the series is constant, so it has no trend to test`, { reason: 'constant' });

  let tMean = 0;
  let xMean = 0;
  for (let i = 0; i < n; i++) {
    tMean += times[i];
    xMean += values[i];
  }
  tMean /= n;
  xMean /= n;
  let stt = 0;
  let stx = 0;
  for (let i = 0; i < n; i++) {
    const c = times[i] - tMean;
    stt += c * c;
    stx += c * (values[i] - xMean);
  }
  const slope = stx / stt;
  const intercept = xMean - slope * tMean;
  const centred = new Float64Array(n);
  const residuals = new Float64Array(n);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    centred[i] = times[i] - tMean;
    residuals[i] = values[i] - xMean - slope * centred[i];
    rss += residuals[i] * residuals[i];
  }
  if (rss === 0) {
    throw new AnalysisInputError(`${fn}: the readings lie exactly on a straight line, so the slope has no sampling error to estimate`, {
      reason: 'straight-line',
    });
  }
  const standardErrorOls = Math.sqrt(rss / (n - 2) / stt);

  // Meat S = Γ_0 + Σ_l w_l (Γ_l + Γ_lᵀ) for ψ_i = u_i (1, c_i); in the centred design XᵀX = diag(n, Σc²).
  // With v_i = u_i c_i the entries of Γ_l are lagged products of u and v.
  const weighted = new Float64Array(n);
  for (let i = 0; i < n; i++) weighted[i] = residuals[i] * centred[i];
  const uu = laggedProducts(residuals, residuals, lag);
  const uv = laggedProducts(residuals, weighted, lag); // Σ u_i v_{i−l}
  const vu = laggedProducts(weighted, residuals, lag); // Σ v_i u_{i−l}
  const vv = laggedProducts(weighted, weighted, lag);
  let s11 = uu[0];
  let s1c = uv[0];
  let scc = vv[0];
  for (let l = 1; l <= lag; l++) {
    const w = 1 - l / (lag + 1);
    s11 += 2 * w * uu[l];
    scc += 2 * w * vv[l];
    s1c += w * (uv[l] + vu[l]);
  }
  const varSlope = scc / (stt * stt);
  const varLevel = s11 / (n * n);
  const covLevelSlope = s1c / (n * stt);
  const standardErrorHac = Math.sqrt(varSlope);
  // Intercept at t = 0: a = level − b·t̄.
  const interceptStandardErrorHac = Math.sqrt(Math.max(0, varLevel - 2 * tMean * covLevelSlope + tMean * tMean * varSlope));
  const tHac = slope / standardErrorHac;
  const z = normalQuantile(1 - alpha / 2);
  const tOls = studentTQuantile(1 - alpha / 2, n - 2);
  return {
    slope,
    intercept,
    standardErrorOls,
    standardErrorHac,
    interceptStandardErrorHac,
    lag,
    tHac,
    pValueHac: chiSquareUpperTail(tHac * tHac, 1),
    interval: [slope - z * standardErrorHac, slope + z * standardErrorHac],
    intervalOls: [slope - tOls * standardErrorOls, slope + tOls * standardErrorOls],
    alpha,
    nonMissing: n,
  };
}
