import { describe, expect, it } from 'vitest';
import { armaConditionalSumOfSquares } from './arma-conditional-sum-of-squares.ts';
import { kalmanArmaLikelihood } from './kalman-arma-likelihood.ts';
import { simulateArma } from './seeded-simulation.testkit.ts';

/** ARMA(1,1) autocovariances with unit innovation variance (Brockwell & Davis 2002, Example 3.2.1). */
function armaAutocovariance(phi: number, theta: number, h: number): number {
  const g0 = (1 + 2 * phi * theta + theta * theta) / (1 - phi * phi);
  const g1 = ((1 + phi * theta) * (phi + theta)) / (1 - phi * phi);
  return h === 0 ? g0 : g1 * phi ** (h - 1);
}

/** y′Γ⁻¹y and ln det Γ by a dense Cholesky factorisation: the exact Gaussian likelihood by brute force. */
function denseGaussian(y: number[], gamma: (i: number, j: number) => number): { quad: number; logDet: number } {
  const n = y.length;
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = gamma(i, j);
      for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
      l[i * n + j] = i === j ? Math.sqrt(s) : s / l[j * n + j];
    }
  }
  const z = new Float64Array(n);
  let quad = 0;
  let logDet = 0;
  for (let i = 0; i < n; i++) {
    let s = y[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * z[k];
    z[i] = s / l[i * n + i];
    quad += z[i] * z[i];
    logDet += 2 * Math.log(l[i * n + i]);
  }
  return { quad, logDet };
}

describe('kalmanArmaLikelihood', () => {
  it('equals the dense exact Gaussian likelihood of ARMA(1,1), also across gaps and after the steady-state switch', () => {
    const [phi, theta, mean] = [0.6, 0.4, 1.5];
    const y = Array.from(simulateArma({ ar: [phi], ma: [theta] }, 200, 31), (v) => v + mean);
    y[150] = NaN;
    y[151] = NaN;
    const present = y.map((v, t) => [v, t] as const).filter(([v]) => !Number.isNaN(v));
    const dense = denseGaussian(
      present.map(([v]) => v - mean),
      (i, j) => armaAutocovariance(phi, theta, Math.abs(present[i][1] - present[j][1])),
    );
    const residuals = new Float64Array(200);
    const sums = kalmanArmaLikelihood(Float64Array.from(y), 1, 1)([phi], [theta], mean, residuals)!;
    expect(sums.counted).toBe(198);
    expect(sums.sumSquares).toBeCloseTo(dense.quad, 9);
    expect(sums.sumLogVariance).toBeCloseTo(dense.logDet, 9);
    expect(Number.isNaN(residuals[150])).toBe(true);
    // Σ residual² = Σ v²/F (residuals are v/√F).
    expect(residuals.reduce((a, v) => (Number.isNaN(v) ? a : a + v * v), 0)).toBeCloseTo(sums.sumSquares, 9);
  });

  it('gives the closed-form AR(1) likelihood: (1 − φ²)y₁² + Σ(y_t − φy_{t−1})² and ln F₁ = −ln(1 − φ²)', () => {
    const phi = -0.7;
    const y = simulateArma({ ar: [phi] }, 50, 8);
    let ssq = (1 - phi * phi) * y[0] ** 2;
    for (let t = 1; t < 50; t++) ssq += (y[t] - phi * y[t - 1]) ** 2;
    const sums = kalmanArmaLikelihood(y, 1, 0)([phi], [], 0)!;
    expect(sums.sumSquares).toBeCloseTo(ssq, 10);
    expect(sums.sumLogVariance).toBeCloseTo(-Math.log(1 - phi * phi), 12);
    expect(kalmanArmaLikelihood(y, 1, 0)([1], [], 0)).toBeNull();
  });
});

describe('armaConditionalSumOfSquares', () => {
  it('is ½ ln of the mean squared conditional residual, starting after the first p values', () => {
    const y = Float64Array.from([1, 2, 0, 1, 3]);
    // AR(1) φ = 0.5, MA(1) θ = 0.2, mean 1: w = 0, 1, −1, 0, 2; e2 = 1, e3 = −1.5 − 0.2, e4 = 0.5 + 0.34, e5 = 2 − 0.168.
    const e = [1, -1.7, 0.84, 2 - 0.2 * 0.84];
    const expected = 0.5 * Math.log(e.reduce((a, v) => a + v * v, 0) / 4);
    expect(armaConditionalSumOfSquares(y, 1, 1)([0.5], [0.2], 1)).toBeCloseTo(expected, 12);
  });
});
