import { describe, expect, it } from 'vitest';
import { integratedArmaForecast } from './integrated-arma-forecast.ts';
import { forecastArma } from './arma-forecast.ts';

// Closed forms of the integrated model (Box, Jenkins, Reinsel & Ljung, Time Series Analysis, 5th ed., §5.2 — from memory):
// a random walk keeps its last level with standard error σ√k; ARIMA(1,1,0) has Ψ_j = (1 − φ^{j+1}) / (1 − φ).
const changes = [0.3, -0.1, 0.4, 0.2, -0.3, 0.1, 0.5, 0.2, 0, 0.1];

describe('integratedArmaForecast', () => {
  it('a random walk: the last level held, standard error σ√k', () => {
    const f = integratedArmaForecast(changes, { ar: [], ma: [], mean: 0, sigma2: 0.04 }, 5, 7.5);
    for (let k = 1; k <= 5; k++) {
      expect(f.mean[k - 1]).toBeCloseTo(7.5, 12);
      expect(f.se[k - 1]).toBeCloseTo(0.2 * Math.sqrt(k), 12);
    }
  });

  it('ARIMA(1,1,0): the level plus the summed change forecasts, variance σ² Σ Ψ_j² with Ψ_j = (1 − φ^{j+1}) / (1 − φ)', () => {
    const phi = 0.6;
    const model = { ar: [phi], ma: [], mean: 0, sigma2: 0.01 };
    const f = integratedArmaForecast(changes, model, 6, 10);
    const ahead = forecastArma(changes, model, 6);
    let level = 10;
    let v = 0;
    for (let k = 1; k <= 6; k++) {
      level += ahead.mean[k - 1];
      v += ((1 - phi ** k) / (1 - phi)) ** 2;
      expect(f.mean[k - 1]).toBeCloseTo(level, 12);
      expect(f.se[k - 1]).toBeCloseTo(Math.sqrt(0.01 * v), 12);
    }
    // the last change was 0.1: the next is forecast at φ · 0.1 (AR(1) without a mean)
    expect(f.mean[0]).toBeCloseTo(10 + phi * 0.1, 10);
  });

  it('refuses a missing last level', () => {
    expect(() => integratedArmaForecast(changes, { ar: [], ma: [], mean: 0, sigma2: 1 }, 2, NaN)).toThrow(
      'integratedArmaForecast: lastLevel must be a finite number (got NaN)',
    );
  });
});
