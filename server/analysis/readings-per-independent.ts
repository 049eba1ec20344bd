import { AnalysisInputError } from './analysis-input-error.ts';

/** ψ weights are summed until this many consecutive terms fall below 1e-12 of the largest. */
const QUIET_TERMS = 50;
const MAX_TERMS = 2_000_000;

/**
 * Readings per independent piece of information about the mean that a stationary ARMA model
 * implies: the ratio of the long-run variance to the variance of one reading,
 * n · Var(x̄) / γ(0) → Σ_h ρ(h) = (θ(1) / φ(1))² / Σ_j ψ_j², so n_eff = n / ratio
 * (Brockwell & Davis, *Introduction to Time Series and Forecasting*, 3rd ed., §2.4.1, Var(x̄)
 * for a stationary series, and §3.1, the causal ψ weights ψ_j = θ_j + Σ_i φ_i ψ_{j−i}).
 * 1 for white noise; (1 + φ) / (1 − φ) for AR(1); (1 + θ)² / (1 + θ²) for MA(1).
 *
 * `ar` are φ_1..φ_p of x_t = Σ φ_i x_{t−i} + e_t + Σ θ_j e_{t−j}, `ma` are θ_1..θ_q (R's signs).
 * Cost: O(m · p) for the m ψ weights summed (m grows like 1 / (1 − |largest AR root|⁻¹)).
 */
export function readingsPerIndependent(ar: readonly number[], ma: readonly number[]): number {
  let phiAtOne = 1;
  for (const phi of ar) phiAtOne -= phi;
  let thetaAtOne = 1;
  for (const theta of ma) thetaAtOne += theta;
  if (!(Math.abs(phiAtOne) > 1e-12))
    throw new AnalysisInputError('readingsPerIndependent: the AR part has a unit root, so the mean has no finite long-run variance', {
      reason: 'unstable-model',
    });
  const p = ar.length;
  const psi: number[] = [1];
  let sumSquares = 1;
  let largest = 1;
  let quiet = 0;
  for (let j = 1; j < MAX_TERMS && quiet < QUIET_TERMS; j++) {
    let value = j <= ma.length ? ma[j - 1] : 0;
    for (let i = 1; i <= Math.min(j, p); i++) value += ar[i - 1] * psi[j - i];
    psi.push(value);
    sumSquares += value * value;
    largest = Math.max(largest, Math.abs(value));
    quiet = Math.abs(value) < 1e-12 * largest && j > ma.length ? quiet + 1 : 0;
    if (!Number.isFinite(sumSquares)) break;
  }
  if (!Number.isFinite(sumSquares) || quiet < QUIET_TERMS) {
    throw new AnalysisInputError('readingsPerIndependent: the AR part is not stationary (its ψ weights do not die out)', { reason: 'unstable-model' });
  }
  return (thetaAtOne / phiAtOne) ** 2 / sumSquares;
}
