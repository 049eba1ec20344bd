/** Result of an ordinary least-squares fit. */
export interface LeastSquaresResult {
  coefficients: Float64Array;
  /** Standard errors s·√((XᵀX)⁻¹)_jj with s² = RSS / (m − k). */
  standardErrors: Float64Array;
  residualSumOfSquares: number;
}

/**
 * Ordinary least squares y ≈ Xβ through a Householder QR factorisation, which keeps the accuracy
 * that forming XᵀX would square away (Golub & Van Loan, *Matrix Computations*, 4th ed.,
 * §5.2.2 and §5.3.3). `columns` holds the k columns of X, each of length m > k; nothing is
 * mutated. Standard errors come from (XᵀX)⁻¹ = R⁻¹R⁻ᵀ.
 *
 * Cost: O(m k²) time, O(m k) space.
 */
export function leastSquares(columns: Float64Array[], y: Float64Array): LeastSquaresResult {
  const k = columns.length;
  const m = y.length;
  const a = columns.map((c) => Float64Array.from(c));
  const b = Float64Array.from(y);
  const diag = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    const col = a[j];
    let norm = 0;
    for (let i = j; i < m; i++) norm += col[i] * col[i];
    norm = Math.sqrt(norm);
    const alpha = col[j] > 0 ? -norm : norm;
    // Householder vector v = col[j..] − alpha·e_1, stored in place.
    col[j] -= alpha;
    let vv = 0;
    for (let i = j; i < m; i++) vv += col[i] * col[i];
    diag[j] = alpha;
    if (vv === 0) continue;
    const apply = (target: Float64Array) => {
      let dot = 0;
      for (let i = j; i < m; i++) dot += col[i] * target[i];
      const f = (2 * dot) / vv;
      for (let i = j; i < m; i++) target[i] -= f * col[i];
    };
    for (let l = j + 1; l < k; l++) apply(a[l]);
    apply(b);
  }
  // R[i][l] = a[l][i] for i < l, R[j][j] = diag[j]; Qᵀy = b.
  const r = (i: number, l: number) => (i === l ? diag[i] : a[l][i]);
  const coefficients = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let s = b[i];
    for (let l = i + 1; l < k; l++) s -= r(i, l) * coefficients[l];
    coefficients[i] = s / r(i, i);
  }
  let rss = 0;
  for (let i = k; i < m; i++) rss += b[i] * b[i];
  // Rows of R⁻¹ give (XᵀX)⁻¹_jj = Σ_l (R⁻¹)_jl².
  const rInv: Float64Array[] = Array.from({ length: k }, () => new Float64Array(k));
  for (let c = 0; c < k; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let l = i + 1; l <= c; l++) s -= r(i, l) * rInv[l][c];
      rInv[i][c] = s / r(i, i);
    }
  }
  const s2 = rss / (m - k);
  const standardErrors = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    let sum = 0;
    for (let c = j; c < k; c++) sum += rInv[j][c] * rInv[j][c];
    standardErrors[j] = Math.sqrt(s2 * sum);
  }
  return { coefficients, standardErrors, residualSumOfSquares: rss };
}
