import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { armaStationaryCovariance } from './arma-stationary-covariance.ts';

/** A fitted ARMA(p, q) model with a mean: x_t − μ = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}, Var e_t = σ². */
export interface ArmaModel {
  ar: ArrayLike<number>;
  ma: ArrayLike<number>;
  mean: number;
  sigma2: number;
}

/** Forecasts 1…h steps past the end of the series and their standard errors. */
export interface ArmaForecast {
  /** E[x_{n+k} | x_1…x_n], k = 1…h. */
  mean: Float64Array;
  /** √Var(x_{n+k} − forecast), k = 1…h (the model's parameters taken as known). */
  se: Float64Array;
}

/**
 * Forecasts of a stationary ARMA(p, q) model h steps past the end of a series, with their
 * standard errors, by the Kalman filter: the series is filtered through the state-space form of
 * Gardner, Harvey & Phillips (1980, Applied Statistics 29:311–322) — state dimension
 * r = max(p, q + 1), transition T with φ in its first column and ones on the superdiagonal,
 * disturbance loading (1, θ_1, …, θ_{r−1})′, the state started at 0 with its stationary
 * covariance — and the filtered state is then projected: a ← T a, P ← T P T′ + R R′, forecast
 * μ + a_1, variance σ² P_11 (Durbin & Koopman, *Time Series Analysis by State Space Methods*,
 * 2nd ed., 2012, §4.11 on forecasting as filtering past the end; Brockwell & Davis,
 * *Introduction to Time Series and Forecasting*, 2nd ed., §3.3 and §8.5). A missing value (NaN)
 * is passed by prediction alone (D&K §4.10). This is the recursion of R's
 * `predict(arima(…), n.ahead = h)` (`KalmanForecast` after `ARIMA_Like`), against which
 * `tests/reference/forecast.reference.test.ts` checks it.
 *
 * The standard errors treat the parameters as known, as R does; for a stationary model they
 * grow towards the series' own standard deviation as the horizon lengthens, and the forecast
 * returns to the mean.
 *
 * Cost: O(n·r²) for the filter, O(h·r²) for the projection; O(r²) space besides the output.
 */
export function forecastArma(x: Series, model: ArmaModel, h: number): ArmaForecast {
  const fn = 'forecastArma';
  if (!(Number.isInteger(h) && h >= 1)) throw new AnalysisInputError(`${fn}: h must be a whole number of steps, at least 1 (got ${h})`);
  const state = armaFilteredState(x, model, fn);
  const mean = new Float64Array(h);
  const se = new Float64Array(h);
  for (let k = 0; k < h; k++) {
    state.advance();
    mean[k] = model.mean + state.a[0];
    se[k] = Math.sqrt(Math.max(0, model.sigma2 * state.P[0]));
  }
  return { mean, se };
}

/**
 * The state of the ARMA model after filtering the whole series (see {@link forecastArma}):
 * the filtered state `a` and its covariance `P` (in units of σ², row-major r × r), the
 * state-space matrices, and `advance()`, which projects the state one step (a ← T a,
 * P ← T P T′ + R R′) in place. Shared by the forecasts and the crossing chance.
 */
export interface ArmaFilteredState {
  r: number;
  phi: Float64Array;
  loading: Float64Array;
  a: Float64Array;
  P: Float64Array;
  advance(): void;
}

/** Filters `x` through the model's state-space form; `fn` names the caller in errors. */
export function armaFilteredState(x: Series, model: ArmaModel, fn = 'armaFilteredState'): ArmaFilteredState {
  assertSeries(x, fn);
  if (!(Number.isFinite(model.sigma2) && model.sigma2 >= 0)) throw new AnalysisInputError(`${fn}: sigma2 must be a finite variance (got ${model.sigma2})`);
  if (!Number.isFinite(model.mean)) throw new AnalysisInputError(`${fn}: mean must be finite (got ${model.mean})`);
  const p = model.ar.length;
  const q = model.ma.length;
  const r = Math.max(p, q + 1);
  const phi = new Float64Array(r);
  for (let i = 0; i < p; i++) phi[i] = model.ar[i];
  const loading = new Float64Array(r);
  loading[0] = 1;
  for (let j = 0; j < q; j++) loading[j + 1] = model.ma[j];

  const P = new Float64Array(r * r);
  if (!armaStationaryCovariance(phi, loading.subarray(1), r, P, new Float64Array(r * r * r * r))) {
    throw new AnalysisInputError(`${fn}: the AR part has a root on the unit circle; the model is not stationary`);
  }
  const a = new Float64Array(r);
  const aNext = new Float64Array(r);
  const PNext = new Float64Array(r * r);

  /** a ← T a; P ← T P T′ + R R′ (T: φ in column 0, ones on the superdiagonal), in place. */
  const advance = () => {
    for (let i = 0; i < r; i++) aNext[i] = phi[i] * a[0] + (i + 1 < r ? a[i + 1] : 0);
    for (let i = 0; i < r; i++) {
      for (let j = 0; j < r; j++) {
        // (T P T′)_ij = Σ_k Σ_l T_ik P_kl T_jl with T_ik = φ_i [k = 0] + [k = i + 1].
        let v = phi[i] * phi[j] * P[0];
        if (j + 1 < r) v += phi[i] * P[j + 1];
        if (i + 1 < r) v += phi[j] * P[(i + 1) * r];
        if (i + 1 < r && j + 1 < r) v += P[(i + 1) * r + j + 1];
        PNext[i * r + j] = v + loading[i] * loading[j];
      }
    }
    a.set(aNext);
    P.set(PNext);
  };

  const gain = new Float64Array(r);
  for (let t = 0; t < x.length; t++) {
    // The first state is the stationary one: the filter starts from a = 0, P = P0 at t = 0.
    if (t > 0) advance();
    const obs = x[t];
    if (obs !== obs) continue;
    const f = P[0];
    if (!(f > 0)) continue;
    const v = obs - model.mean - a[0];
    // Update with gain P Z′ / F, Z = (1, 0, …, 0).
    for (let i = 0; i < r; i++) gain[i] = P[i * r];
    for (let i = 0; i < r; i++) a[i] += (gain[i] * v) / f;
    for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i * r + j] -= (gain[i] * gain[j]) / f;
  }
  return { r, phi, loading, a, P, advance };
}
