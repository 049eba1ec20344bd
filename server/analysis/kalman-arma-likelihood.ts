import { armaStationaryCovariance } from './arma-stationary-covariance.ts';

/** Sums from one pass of the Kalman filter over the series (see `kalmanArmaLikelihood`). */
export interface KalmanArmaSums {
  /** Σ v_t² / F_t over the counted steps (v_t the innovation, F_t its variance over σ²). */
  sumSquares: number;
  /** Σ ln F_t over the counted steps. */
  sumLogVariance: number;
  /** How many steps were counted (present values with F_t < 10⁴, as R's `arima`). */
  counted: number;
}

/** One likelihood evaluation: writes sums into the shared result, or returns null (AR root on the unit circle). */
export type KalmanArmaEvaluator = (phi: ArrayLike<number>, theta: ArrayLike<number>, mean: number, residuals?: Float64Array) => KalmanArmaSums | null;

/**
 * Prepares the exact Gaussian likelihood of ARMA(p, q) models with a fixed mean for one series
 * and returns an evaluator that runs the Kalman filter for given (φ, θ, μ). Everything is
 * preallocated here, so an evaluation allocates nothing — the optimiser calls it thousands of
 * times.
 *
 * State-space form and recursions as Gardner, Harvey & Phillips (1980, Applied Statistics
 * 29:311–322) and R's `arima` (`ARIMA_Like`): state dimension r = max(p, q + 1), observation
 * y_t − μ = first state element, initial state 0 with the stationary covariance P0
 * (`armaStationaryCovariance`). With unit innovation variance the filter gives innovations v_t
 * and their variances F_t (Durbin & Koopman, *Time Series Analysis by State Space Methods*,
 * 2nd ed., §4.3.2, eq. 4.24), and the σ²-concentrated log-likelihood is
 * −(N/2)·ln(Σ v_t²/F_t / N) − ½ Σ ln F_t + const (D&K §7.2.2, eq. 7.4; Harvey, *Forecasting,
 * Structural Time Series Models and the Kalman Filter*, 1989, §3.4). As R, a step whose
 * F_t ≥ 10⁴ is filtered but not counted, and a missing value (NaN) is skipped by prediction
 * alone (D&K §4.10), so gaps are supported.
 *
 * Steady state: for an invertible MA part the filtered state covariance P_t decays
 * geometrically to 0 (the state becomes a function of the past observations), after which
 * F_t = 1 and the gain is R = (1, θ_1, …) exactly (D&K §4.3.4 on the steady state). Once every
 * entry of P_t is below 1e-13 the filter switches to that O(r) recursion — the innovations form
 * a_{t+1} = T a_t + R v_t — and only leaves it at a missing value. The neglected terms are of
 * the order of P_t itself. On long series this makes one evaluation O(n·r) instead of
 * O(n·r²).
 *
 * `residuals` (length n), when given, receives v_t / √F_t (NaN where y is missing), which is
 * what R's `residuals(arima(…))` returns. Cost: O(n·r) after the transient, O(r⁶) for P0.
 */
export function kalmanArmaLikelihood(y: Float64Array, p: number, q: number): KalmanArmaEvaluator {
  const n = y.length;
  const r = Math.max(p, q + 1);
  const phiPad = new Float64Array(r);
  const loading = new Float64Array(r);
  const a = new Float64Array(r);
  const aNew = new Float64Array(r);
  const gainVector = new Float64Array(r);
  const cov = new Float64Array(r * r);
  const covNew = new Float64Array(r * r);
  const disturbance = new Float64Array(r * r);
  const work = new Float64Array(r * r * r * r);
  const sums: KalmanArmaSums = { sumSquares: 0, sumLogVariance: 0, counted: 0 };
  const tally = new Float64Array(2);
  const steadyTolerance = 1e-13;

  return (phi, theta, mean, residuals) => {
    phiPad.fill(0);
    for (let i = 0; i < p; i++) phiPad[i] = phi[i];
    loading.fill(0);
    loading[0] = 1;
    for (let j = 0; j < q; j++) loading[j + 1] = theta[j];
    for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) disturbance[i * r + j] = loading[i] * loading[j];
    if (!armaStationaryCovariance(phiPad, loading.subarray(1), r, covNew, work)) return null;
    a.fill(0);
    let sumSquares = 0;
    let sumLog = 0;
    let counted = 0;
    let steady = false;
    for (let t = 0; t < n; t++) {
      if (steady) {
        // Runs the O(r) innovations recursion up to the next gap (or the end).
        const stop = steadyRun(y, t, mean, phiPad, loading, a, r, residuals, tally);
        sumSquares += tally[0];
        counted += tally[1];
        if (stop >= n) break;
        // A gap at `stop`: predict through it; the state is uncertain again, P = R R′.
        steady = false;
        const a0 = a[0];
        for (let i = 0; i < r - 1; i++) a[i] = a[i + 1] + phiPad[i] * a0;
        a[r - 1] = phiPad[r - 1] * a0;
        cov.set(disturbance);
        if (residuals) residuals[stop] = NaN;
        t = stop;
        continue;
      }
      // Prediction of the state: aNew = T a.
      const a0 = a[0];
      for (let i = 0; i < r - 1; i++) aNew[i] = a[i + 1] + phiPad[i] * a0;
      aNew[r - 1] = phiPad[r - 1] * a0;
      const obs = y[t];
      if (t > 0) {
        // covNew = T cov T′ + R R′, written out for the sparse T (as ARIMA_Like).
        const c00 = cov[0];
        for (let i = 0; i < r; i++) {
          const phiI = phiPad[i];
          for (let j = 0; j < r; j++) {
            let v = disturbance[i * r + j] + phiI * phiPad[j] * c00;
            if (i < r - 1 && j < r - 1) v += cov[(i + 1) * r + j + 1];
            if (j < r - 1) v += phiI * cov[j + 1];
            if (i < r - 1) v += phiPad[j] * cov[(i + 1) * r];
            covNew[i * r + j] = v;
          }
        }
      }
      if (obs === obs) {
        const v = obs - mean - aNew[0];
        const f = covNew[0];
        for (let i = 0; i < r; i++) gainVector[i] = covNew[i * r];
        if (f < 1e4) {
          counted++;
          sumSquares += (v * v) / f;
          sumLog += Math.log(f);
        }
        if (residuals) residuals[t] = v / Math.sqrt(f);
        let largest = 0;
        for (let i = 0; i < r; i++) {
          a[i] = aNew[i] + (gainVector[i] * v) / f;
          const gi = gainVector[i] / f;
          for (let j = 0; j < r; j++) {
            const c = covNew[i * r + j] - gi * gainVector[j];
            cov[i * r + j] = c;
            const abs = c < 0 ? -c : c;
            if (abs > largest) largest = abs;
          }
        }
        if (largest < steadyTolerance) steady = true;
      } else {
        for (let i = 0; i < r; i++) a[i] = aNew[i];
        cov.set(covNew);
        if (residuals) residuals[t] = NaN;
      }
    }
    sums.sumSquares = sumSquares;
    sums.sumLogVariance = sumLog;
    sums.counted = counted;
    return sums;
  };
}

/**
 * The steady-state filter from step `from` on: with P = 0 the prediction is
 * ŷ_t = a_{t,1} + φ_1 a_{t−1,0} folded into one pass, v_t = y_t − μ − ŷ_t, F_t = 1, and the state
 * update a_i ← a_{i+1} + φ_i a_0 + R_i v_t runs in place (ascending i reads a_{i+1} before
 * writing it). Stops at the first missing value and returns its index (n when none); Σ v² and
 * the count go to tally[0], tally[1].
 */
function steadyRun(
  y: Float64Array,
  from: number,
  mean: number,
  phi: Float64Array,
  loading: Float64Array,
  a: Float64Array,
  r: number,
  residuals: Float64Array | undefined,
  tally: Float64Array,
): number {
  const n = y.length;
  let ssq = 0;
  let t = from;
  const last = r - 1;
  for (; t < n; t++) {
    const obs = y[t];
    if (obs !== obs) break;
    const a0 = a[0];
    const v = obs - mean - ((last > 0 ? a[1] : 0) + phi[0] * a0);
    for (let i = 0; i < last; i++) a[i] = a[i + 1] + phi[i] * a0 + loading[i] * v;
    a[last] = phi[last] * a0 + loading[last] * v;
    ssq += v * v;
    if (residuals) residuals[t] = v;
  }
  tally[0] = ssq;
  tally[1] = t - from;
  return t;
}
