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
 * With `keepCoefficients: false` only two rows are kept (the partial autocorrelations and
 * variances are the same numbers), which saves the K²/2 doubles of every order's coefficients.
 *
 * Cost: O(K²) time; O(K²) space, O(K) without the coefficients.
 */
export function durbinLevinson(gamma: ArrayLike<number>, maxOrder: number, options: { keepCoefficients?: boolean } = {}): DurbinLevinsonResult {
  const keep = options.keepCoefficients ?? true;
  const partial = new Float64Array(maxOrder);
  const coefficients: Float64Array[] = [];
  const variances = new Float64Array(maxOrder + 1);
  variances[0] = gamma[0];
  let previous = new Float64Array(keep ? 0 : maxOrder);
  let spare = keep ? previous : new Float64Array(maxOrder);
  for (let k = 1; k <= maxOrder; k++) {
    // Four partial sums break the chain of dependent additions (the order of summation changes
    // the result only by rounding).
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let j = 1;
    for (; j + 3 < k; j += 4) {
      s0 += previous[j - 1] * gamma[k - j];
      s1 += previous[j] * gamma[k - j - 1];
      s2 += previous[j + 1] * gamma[k - j - 2];
      s3 += previous[j + 2] * gamma[k - j - 3];
    }
    for (; j < k; j++) s0 += previous[j - 1] * gamma[k - j];
    const num = gamma[k] - (s0 + s1 + (s2 + s3));
    const phiKK = num / variances[k - 1];
    const row = keep ? new Float64Array(k) : spare;
    for (let i = 1; i < k; i++) row[i - 1] = previous[i - 1] - phiKK * previous[k - i - 1];
    row[k - 1] = phiKK;
    partial[k - 1] = phiKK;
    variances[k] = variances[k - 1] * (1 - phiKK * phiKK);
    if (keep) coefficients.push(row);
    spare = previous;
    previous = row;
  }
  return { partial, coefficients, variances };
}
