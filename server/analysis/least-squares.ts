/** Result of an ordinary least-squares fit. */
export interface LeastSquaresResult {
  coefficients: Float64Array;
  /** Standard errors s·√((XᵀX)⁻¹)_jj with s² = RSS / (m − k). */
  standardErrors: Float64Array;
  residualSumOfSquares: number;
}

/** Rows of X taken in per pass: the working block, (k + 1 + BLOCK_ROWS) × (k + 1) doubles, stays in cache. */
const BLOCK_ROWS = 256;

/**
 * Ordinary least squares y ≈ Xβ through a Householder QR factorisation, which keeps the accuracy
 * that forming XᵀX would square away (Golub & Van Loan, *Matrix Computations*, 4th ed.,
 * §5.2.2 and §5.3.3). `columns` holds the k columns of X, each of length m > k; nothing is
 * mutated. Standard errors come from (XᵀX)⁻¹ = R⁻¹R⁻ᵀ.
 *
 * The QR of the augmented matrix [X y] is built one block of rows at a time: the triangular
 * factor found so far is stacked on the next block and that small matrix is reduced by
 * Householder reflections again (updating a QR factorisation as rows are appended, Golub & Van
 * Loan §6.5; the sequential "tall-skinny QR" of Demmel, Grigori, Hoemmen & Langou 2012, SIAM J.
 * Sci. Comput. 34:A206–A239). Each pass works on a column-major block that fits in cache
 * instead of streaming k columns of length m through memory k times, with the same backward
 * stability as one Householder QR of the whole matrix. The last diagonal entry of the augmented
 * factor is ±‖y − Xβ‖, the square root of the residual sum of squares.
 *
 * Cost: O(m k²) time, O(k² + k · 256) space besides the input.
 */
export function leastSquares(columns: ArrayLike<number>[], y: ArrayLike<number>): LeastSquaresResult {
  const k = columns.length;
  const m = y.length;
  const p = k + 1;
  const ld = p + BLOCK_ROWS;
  // Column-major work block: rows 0..p−1 hold the triangular factor, rows p.. the new data rows.
  const w = new Float64Array(ld * p);
  const sources = [...columns, y];
  for (let start = 0; start < m; start += BLOCK_ROWS) {
    const rows = Math.min(BLOCK_ROWS, m - start);
    const end = p + rows;
    for (let c = 0; c < p; c++) {
      const src = sources[c];
      const base = c * ld + p;
      for (let i = 0; i < rows; i++) w[base + i] = src[start + i];
    }
    for (let j = 0; j < p; j++) {
      // Column j below its diagonal is zero in the triangular part, so the reflector touches row j and the data rows only.
      const cj = j * ld;
      const diagonal = w[cj + j];
      let below = 0;
      for (let i = cj + p; i < cj + end; i++) below += w[i] * w[i];
      if (below === 0 && diagonal === 0) continue;
      const norm = Math.sqrt(diagonal * diagonal + below);
      const alpha = diagonal > 0 ? -norm : norm;
      const head = diagonal - alpha;
      const vv = head * head + below;
      w[cj + j] = alpha;
      if (vv <= 0) continue;
      let l = j + 1;
      // Four columns per sweep: each reflector entry is loaded once for all four.
      for (; l + 3 < p; l += 4) {
        const c0 = l * ld;
        const c1 = c0 + ld;
        const c2 = c1 + ld;
        const c3 = c2 + ld;
        let d0 = head * w[c0 + j];
        let d1 = head * w[c1 + j];
        let d2 = head * w[c2 + j];
        let d3 = head * w[c3 + j];
        for (let i = p; i < end; i++) {
          const v = w[cj + i];
          d0 += v * w[c0 + i];
          d1 += v * w[c1 + i];
          d2 += v * w[c2 + i];
          d3 += v * w[c3 + i];
        }
        const f0 = (2 * d0) / vv;
        const f1 = (2 * d1) / vv;
        const f2 = (2 * d2) / vv;
        const f3 = (2 * d3) / vv;
        w[c0 + j] -= f0 * head;
        w[c1 + j] -= f1 * head;
        w[c2 + j] -= f2 * head;
        w[c3 + j] -= f3 * head;
        for (let i = p; i < end; i++) {
          const v = w[cj + i];
          w[c0 + i] -= f0 * v;
          w[c1 + i] -= f1 * v;
          w[c2 + i] -= f2 * v;
          w[c3 + i] -= f3 * v;
        }
      }
      for (; l < p; l++) {
        const cl = l * ld;
        let dot = head * w[cl + j];
        for (let i = p; i < end; i++) dot += w[cj + i] * w[cl + i];
        const f = (2 * dot) / vv;
        w[cl + j] -= f * head;
        for (let i = p; i < end; i++) w[cl + i] -= f * w[cj + i];
      }
    }
  }
  // R[i][l] (i ≤ l) = w[l·ld + i]; column k holds Qᵀy and |R[k][k]| = ‖residual‖.
  const r = (i: number, l: number) => w[l * ld + i];
  const coefficients = new Float64Array(k);
  for (let i = k - 1; i >= 0; i--) {
    let s = r(i, k);
    for (let l = i + 1; l < k; l++) s -= r(i, l) * coefficients[l];
    coefficients[i] = s / r(i, i);
  }
  const rss = r(k, k) * r(k, k);
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
