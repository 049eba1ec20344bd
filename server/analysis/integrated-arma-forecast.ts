import { AnalysisInputError, type Series } from './analysis-input-error.ts';
import { type ArmaForecast, type ArmaModel, forecastArma } from './arma-forecast.ts';

/**
 * Forecasts of a level whose changes follow an ARMA(p, q) model (an ARIMA(p, 1, q) model of the
 * level), 1…h steps past its last value `lastLevel`, with standard errors. `changes` are the
 * first differences x_t − x_{t−1} (NaN where either is missing) and `model` their fitted ARMA
 * (usually without a mean, as R's `arima` fits for d = 1).
 *
 * The forecast of the level is the last level plus the summed forecasts of the changes (the
 * Kalman forecasts of {@link forecastArma}); its error k steps ahead is Σ_{j<k} Ψ_j e_{n+k−j}
 * with Ψ_j = ψ_0 + … + ψ_j the cumulated ψ-weights of the ARMA (ψ_0 = 1,
 * ψ_j = Σ_i φ_i ψ_{j−i} + θ_j), so Var = σ² Σ_{j<k} Ψ_j² (Box, Jenkins, Reinsel & Ljung, *Time
 * Series Analysis*, 5th ed., 2015, §5.2 — the ψ-weights of the integrated model; Brockwell &
 * Davis, *Introduction to Time Series and Forecasting*, 2nd ed., §6.4). This treats the past
 * shocks as known, which the filter attains after a long record of an invertible model; R's
 * `predict(arima(x, order = c(p, 1, q)), n.ahead = h)` (exact Kalman filter with a diffuse start)
 * agrees to the accuracy tests/reference/early-warning.reference.test.ts records.
 *
 * Cost: O(n·r²) for the filter, O(h·(p + h)) for the ψ-weights.
 */
export function integratedArmaForecast(changes: Series, model: ArmaModel, h: number, lastLevel: number): ArmaForecast {
  const fn = 'integratedArmaForecast';
  if (!Number.isFinite(lastLevel)) throw new AnalysisInputError(`${fn}: lastLevel must be a finite number (got ${lastLevel})`);
  const ahead = forecastArma(changes, model, h);
  const p = model.ar.length;
  const q = model.ma.length;
  const psi = new Float64Array(h);
  psi[0] = 1;
  for (let j = 1; j < h; j++) {
    let v = j <= q ? model.ma[j - 1] : 0;
    for (let i = 1; i <= Math.min(j, p); i++) v += model.ar[i - 1] * psi[j - i];
    psi[j] = v;
  }
  const mean = new Float64Array(h);
  const se = new Float64Array(h);
  let level = lastLevel;
  let cumulated = 0;
  let variance = 0;
  for (let k = 0; k < h; k++) {
    level += ahead.mean[k];
    mean[k] = level;
    cumulated += psi[k];
    variance += cumulated * cumulated;
    se[k] = Math.sqrt(model.sigma2 * variance);
  }
  return { mean, se };
}
