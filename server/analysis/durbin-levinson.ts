/** The output of the Durbin–Levinson recursion for orders 1..maxOrder. */
export interface DurbinLevinsonResult {
  /** Partial autocorrelations φ_11, φ_22, …, φ_KK (index 0 is lag 1). */
  partial: Float64Array;
  /** coefficients[p − 1] holds φ_p1 … φ_pp, the best linear predictor of order p. */
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
 * Cost: O(K²) time and space.
 */
export function durbinLevinson(gamma: ArrayLike<number>, maxOrder: number): DurbinLevinsonResult {
  const partial = new Float64Array(maxOrder);
  const coefficients: Float64Array[] = [];
  const variances = new Float64Array(maxOrder + 1);
  variances[0] = gamma[0];
  let previous = new Float64Array(0);
  for (let k = 1; k <= maxOrder; k++) {
    let num = gamma[k];
    for (let j = 1; j < k; j++) num -= previous[j - 1] * gamma[k - j];
    const phiKK = num / variances[k - 1];
    const row = new Float64Array(k);
    for (let j = 1; j < k; j++) row[j - 1] = previous[j - 1] - phiKK * previous[k - j - 1];
    row[k - 1] = phiKK;
    partial[k - 1] = phiKK;
    variances[k] = variances[k - 1] * (1 - phiKK * phiKK);
    coefficients.push(row);
    previous = row;
  }
  return { partial, coefficients, variances };
}
