/** The output of the Durbin–Levinson recursion for orders 1..maxOrder. */
export interface DurbinLevinsonResult {
  /** Partial autocorrelations φ_11, φ_22, …, φ_KK (index 0 is lag 1). */
  partial: Float64Array;
  /**
   * coefficients[p − 1] holds φ_p1 … φ_pp, the best linear predictor of order p (empty when
   * `keepCoefficients` is false).
   */
  coefficients: Float64Array[];
  /**
   * One-step prediction error variances v_0 … v_K (v_0 = γ_0), in the units of the input:
   * with correlations as input they are variance ratios.
   */
  variances: Float64Array;
}

/**
 * Durbin–Levinson recursion: solves the Yule–Walker equations of every order 1..maxOrder from
 * autocovariances (or autocorrelations) γ_0..γ_K, giving the partial autocorrelations, the AR
 * coefficients of each order and the prediction error variances.
 *
 * φ_kk = (γ_k − Σ_{j<k} φ_{k−1,j} γ_{k−j}) / v_{k−1}, φ_kj = φ_{k−1,j} − φ_kk φ_{k−1,k−j},
 * v_k = v_{k−1}(1 − φ_kk²) (Brockwell & Davis, *Introduction to Time Series and Forecasting*,
 * 2nd ed., Prop. 2.5.1 and §5.1.1; Durbin 1960, Rev. Int. Stat. Inst. 28:233–244).
 *
 * The order-k coefficients replace the order-(k − 1) ones in one array, φ_{k,j} and φ_{k,k−j}
 * updated together from the old pair (the in-place Levinson step: Golub & Van Loan, *Matrix
 * Computations*, 4th ed., Algorithm 4.7.1), and the sum for φ_kk runs forward over a reversed
 * copy of γ, so both inner loops stream through memory in one direction. With
 * `keepCoefficients: false` nothing else is kept (the partial autocorrelations and variances
 * are the same numbers), which saves the K²/2 doubles of every order's coefficients.
 *
 * Cost: O(K²) time; O(K²) space, O(K) without the coefficients.
 */
export function durbinLevinson(gamma: ArrayLike<number>, maxOrder: number, options: { keepCoefficients?: boolean } = {}): DurbinLevinsonResult {
  const keep = options.keepCoefficients ?? true;
  const partial = new Float64Array(maxOrder);
  const coefficients: Float64Array[] = [];
  const variances = new Float64Array(maxOrder + 1);
  variances[0] = gamma[0];
  // phi[j] = φ_{k,j} for j = 1..k (index 0 unused); reversed[maxOrder − h] = γ_h.
  const phi = new Float64Array(maxOrder + 1);
  const reversed = new Float64Array(maxOrder + 1);
  for (let h = 0; h <= maxOrder; h++) reversed[maxOrder - h] = gamma[h];
  for (let k = 1; k <= maxOrder; k++) {
    // Σ_{j<k} φ_{k−1,j} γ_{k−j}, with γ_{k−j} = reversed[maxOrder − k + j]. Two partial sums
    // break the chain of dependent additions (the order changes the result only by rounding).
    const offset = maxOrder - k;
    let s0 = 0;
    let s1 = 0;
    let j = 1;
    for (; j + 1 < k; j += 2) {
      s0 += phi[j] * reversed[offset + j];
      s1 += phi[j + 1] * reversed[offset + j + 1];
    }
    if (j < k) s0 += phi[j] * reversed[offset + j];
    const phiKK = (gamma[k] - (s0 + s1)) / variances[k - 1];
    let low = 1;
    let high = k - 1;
    for (; low < high; low++, high--) {
      const a = phi[low];
      const b = phi[high];
      phi[low] = a - phiKK * b;
      phi[high] = b - phiKK * a;
    }
    if (low === high) phi[low] -= phiKK * phi[low];
    phi[k] = phiKK;
    partial[k - 1] = phiKK;
    variances[k] = variances[k - 1] * (1 - phiKK * phiKK);
    if (keep) coefficients.push(phi.slice(1, k + 1));
  }
  return { partial, coefficients, variances };
}
