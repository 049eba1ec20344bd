/**
 * Solves A X = B in place for a small dense system (A is m × m, row-major; B is m × k,
 * row-major) by Gaussian elimination with partial pivoting (Golub & Van Loan, *Matrix
 * Computations*, 4th ed., Algorithm 3.4.1 with §3.2 back substitution). On return B holds X and
 * A is overwritten. Returns false when a pivot is zero or not finite (A singular to working
 * precision), leaving B undefined.
 *
 * Used for the ARMA engine's tiny systems: the stationary state covariance (m = r² ≤ 36) and the
 * inverse of the observed information (m ≤ 12). Cost: O(m³ + m²k).
 */
export function armaLinearSolve(a: Float64Array, b: Float64Array, m: number, k: number): boolean {
  for (let col = 0; col < m; col++) {
    let pivotRow = col;
    let best = Math.abs(a[col * m + col]);
    for (let row = col + 1; row < m; row++) {
      const v = Math.abs(a[row * m + col]);
      if (v > best) {
        best = v;
        pivotRow = row;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return false;
    if (pivotRow !== col) {
      for (let j = 0; j < m; j++) {
        const t = a[col * m + j];
        a[col * m + j] = a[pivotRow * m + j];
        a[pivotRow * m + j] = t;
      }
      for (let j = 0; j < k; j++) {
        const t = b[col * k + j];
        b[col * k + j] = b[pivotRow * k + j];
        b[pivotRow * k + j] = t;
      }
    }
    const pivot = a[col * m + col];
    for (let row = col + 1; row < m; row++) {
      const factor = a[row * m + col] / pivot;
      if (factor === 0) continue;
      for (let j = col; j < m; j++) a[row * m + j] -= factor * a[col * m + j];
      for (let j = 0; j < k; j++) b[row * k + j] -= factor * b[col * k + j];
    }
  }
  for (let row = m - 1; row >= 0; row--) {
    const pivot = a[row * m + row];
    for (let j = 0; j < k; j++) {
      let s = b[row * k + j];
      for (let c = row + 1; c < m; c++) s -= a[row * m + c] * b[c * k + j];
      b[row * k + j] = s / pivot;
    }
  }
  return true;
}
