import type { LeastSquaresResult } from './least-squares.ts';

/** Beyond this condition number of the scaled XᵀX the normal equations give way to QR. */
const MAX_SCALED_CONDITION = 1e6;

/** Digits the residual sum of squares may lose to cancellation in yᵀy − βᵀXᵀy before it is summed directly. */
const MAX_RSS_CANCELLATION = 1e-6;

/** ‖y − Xβ‖², summed from the residuals themselves. */
function residualSumOfSquares(columns: ArrayLike<number>[], y: ArrayLike<number>, beta: Float64Array): number {
  const residual = Float64Array.from(y);
  for (let j = 0; j < columns.length; j++) {
    const c = columns[j];
    const b = beta[j];
    for (let r = 0; r < residual.length; r++) residual[r] -= b * c[r];
  }
  let rss = 0;
  for (let r = 0; r < residual.length; r++) rss += residual[r] * residual[r];
  return rss;
}

/**
 * Ordinary least squares y ≈ Xβ from the cross products XᵀX and Xᵀy, for a caller that can form
 * them far more cheaply than a QR factorisation costs (a regression on lagged copies of one
 * series, where the products slide along the series). Returns null when the problem is too
 * ill-conditioned for this route; the caller then uses `leastSquares` (Householder QR).
 *
 * The columns are scaled to unit length before the Cholesky factorisation, so the accuracy
 * depends on the condition number κ of the scaled matrix (van der Sluis 1969, Numer. Math.
 * 14:14–23); κ is bounded from the factor, ‖R‖_F² ‖R⁻¹‖_F² ≥ κ₂(XᵀX), and above 10⁶ the route
 * is refused, which keeps the standard errors (read off (XᵀX)⁻¹ = R⁻¹R⁻ᵀ) within about
 * κ·ε ≈ 10⁻¹⁰ relative, and so the coefficients (the forward error of the normal equations
 * is of order κ·ε: Björck, *Numerical Methods for Least Squares Problems*, 1996, §2.2.3). The
 * residual sum of squares is yᵀy − βᵀXᵀy unless that loses more than six digits to
 * cancellation; then it is summed from the residuals of `columns` and `y`, which are read only
 * then.
 *
 * `gram` is the k×k matrix XᵀX (row-major), `xty` = Xᵀy and `yty` = yᵀy.
 * Cost: O(k³), plus one pass over the k columns, O(m k), for a close fit.
 */
export function leastSquaresFromGram(
  gram: Float64Array,
  xty: Float64Array,
  yty: number,
  columns: ArrayLike<number>[],
  y: ArrayLike<number>,
): LeastSquaresResult | null {
  const k = columns.length;
  const m = y.length;
  const scale = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const d = gram[j * k + j];
    if (!(d > 0)) return null;
    scale[j] = 1 / Math.sqrt(d);
  }
  // Cholesky of the scaled matrix: R upper triangular, RᵀR = D XᵀX D (Golub & Van Loan §4.2).
  const R = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = i; j < k; j++) {
      let s = gram[i * k + j] * scale[i] * scale[j];
      for (let l = 0; l < i; l++) s -= R[l * k + i] * R[l * k + j];
      if (i === j) {
        if (!(s > 0)) return null;
        R[i * k + i] = Math.sqrt(s);
      } else {
        R[i * k + j] = s / R[i * k + i];
      }
    }
  }
  // R⁻¹ (upper triangular), for the condition bound and the standard errors.
  const inv = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let l = i + 1; l <= c; l++) s -= R[i * k + l] * inv[l * k + c];
      inv[i * k + c] = s / R[i * k + i];
    }
  }
  let normR = 0;
  let normInv = 0;
  for (let i = 0; i < k * k; i++) {
    normR += R[i] * R[i];
    normInv += inv[i] * inv[i];
  }
  if (!(normR * normInv <= MAX_SCALED_CONDITION)) return null;

  /** β for right-hand side Xᵀv = rhs: D R⁻¹ R⁻ᵀ D rhs. */
  const solve = (rhs: Float64Array): Float64Array => {
    const z = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      let s = rhs[i] * scale[i];
      for (let l = 0; l < i; l++) s -= R[l * k + i] * z[l];
      z[i] = s / R[i * k + i];
    }
    const b = new Float64Array(k);
    for (let i = k - 1; i >= 0; i--) {
      let s = z[i];
      for (let l = i + 1; l < k; l++) s -= R[i * k + l] * b[l];
      b[i] = s / R[i * k + i];
    }
    for (let i = 0; i < k; i++) b[i] *= scale[i];
    return b;
  };
  const coefficients = solve(xty);
  // At the solution ‖y − Xβ‖² = yᵀy − βᵀXᵀy; when that difference cancels most digits away
  // (a close fit), the residuals are summed instead.
  let beta = 0;
  for (let j = 0; j < k; j++) beta += coefficients[j] * xty[j];
  const shortcut = yty - beta;
  const rss = shortcut > MAX_RSS_CANCELLATION * yty ? shortcut : residualSumOfSquares(columns, y, coefficients);
  const s2 = rss / (m - k);
  const standardErrors = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    let sum = 0;
    for (let c = j; c < k; c++) sum += inv[j * k + c] * inv[j * k + c];
    standardErrors[j] = Math.sqrt(s2 * sum) * scale[j];
  }
  return { coefficients, standardErrors, residualSumOfSquares: rss };
}
