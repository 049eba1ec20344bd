/** XᵀX and Xᵀy of the augmented Dickey–Fuller regression, in the column order of its design. */
export interface DickeyFullerCrossProducts {
  /** Columns: the level x_{t−1} − shift, the differences Δx_{t−1} … Δx_{t−lags}, the constant. */
  columns: Float64Array[];
  /** k×k row-major, k = lags + 2. */
  gram: Float64Array;
  xty: Float64Array;
  /** yᵀy, y = Δx_t. */
  yty: number;
}

/**
 * The cross products of the regression Δx_t on (x_{t−1} − shift, Δx_{t−1}, …, Δx_{t−lags}, 1)
 * over the rows t = lags + 1 … n − 1, built from the lag structure instead of row by row: every
 * lagged difference column is a window of the same difference series one step further back, so
 * the product of windows a + 1 and b + 1 is that of windows a and b with one term added at the
 * front and one dropped at the end (the sliding-window sums behind the covariance method of
 * linear prediction: Makhoul 1975, Proc. IEEE 63:561–580, eq. 35). That costs O(n · lags)
 * instead of the O(n · lags²) of forming XᵀX directly; a window's sum is the change of the
 * level across it. Shifting the level by a constant (its
 * mean) leaves its coefficient and standard error unchanged in a regression with a constant and
 * keeps the scaled XᵀX well conditioned.
 */
export function dickeyFullerCrossProducts(values: Float64Array, diff: Float64Array, lags: number, shift: number): DickeyFullerCrossProducts {
  const L = lags;
  const rows = diff.length - L;
  const k = L + 2;
  const window = (h: number) => diff.subarray(L - h, L - h + rows);
  const level = new Float64Array(rows);
  for (let r = 0; r < rows; r++) level[r] = values[L + r] - shift;
  // P[a][b] = Σ_r Δ_{L−a+r} Δ_{L−b+r} for 0 ≤ a ≤ b ≤ L (window 0 is the response); the first
  // row and the level's products with every window in one pass per window.
  const P = new Float64Array((L + 1) * (L + 1));
  const levelDot = new Float64Array(L + 1);
  const latest = window(0);
  for (let g = 0; g <= L; g++) {
    const w = window(g);
    let p0 = 0;
    let p1 = 0;
    let l0 = 0;
    let l1 = 0;
    let r = 0;
    for (; r + 1 < rows; r += 2) {
      const w0 = w[r];
      const w1 = w[r + 1];
      p0 += latest[r] * w0;
      p1 += latest[r + 1] * w1;
      l0 += level[r] * w0;
      l1 += level[r + 1] * w1;
    }
    if (r < rows) {
      p0 += latest[r] * w[r];
      l0 += level[r] * w[r];
    }
    P[g] = p0 + p1;
    levelDot[g] = l0 + l1;
  }
  for (let a = 0; a < L; a++) {
    for (let b = a; b < L; b++) {
      P[(a + 1) * (L + 1) + b + 1] = P[a * (L + 1) + b] + diff[L - a - 1] * diff[L - b - 1] - diff[L - a + rows - 1] * diff[L - b + rows - 1];
    }
  }
  // A window of differences sums to the change of the level across it (telescoping).
  const windowSum = new Float64Array(L + 1);
  for (let h = 0; h <= L; h++) windowSum[h] = values[L - h + rows] - values[L - h];
  let levelSquares = 0;
  let levelSum = 0;
  for (let r = 0; r < rows; r++) {
    levelSquares += level[r] * level[r];
    levelSum += level[r];
  }
  const gram = new Float64Array(k * k);
  const set = (i: number, j: number, v: number) => {
    gram[i * k + j] = v;
    gram[j * k + i] = v;
  };
  set(0, 0, levelSquares);
  set(0, k - 1, levelSum);
  set(k - 1, k - 1, rows);
  for (let a = 1; a <= L; a++) {
    set(0, a, levelDot[a]);
    set(a, k - 1, windowSum[a]);
    for (let b = a; b <= L; b++) set(a, b, P[a * (L + 1) + b]);
  }
  const xty = new Float64Array(k);
  xty[0] = levelDot[0];
  for (let a = 1; a <= L; a++) xty[a] = P[a];
  xty[k - 1] = windowSum[0];
  const columns: Float64Array[] = [level];
  for (let h = 1; h <= L; h++) columns.push(window(h));
  columns.push(new Float64Array(rows).fill(1));
  return { columns, gram, xty, yty: P[0] };
}
