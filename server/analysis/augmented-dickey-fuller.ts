import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { integerOption } from './integer-option.ts';
import { dickeyFullerCrossProducts } from './dickey-fuller-cross-products.ts';
import { leastSquares } from './least-squares.ts';
import { leastSquaresFromGram } from './least-squares-from-gram.ts';

export interface AugmentedDickeyFullerOptions {
  /** Lagged differences in the regression; default Schwert's ⌊12 (n/100)^{1/4}⌋ (Schwert 1989). */
  lags?: number;
}

export interface AugmentedDickeyFullerResult {
  /** t-ratio of β in Δx_t = α + β x_{t−1} + Σ γ_i Δx_{t−i} + e_t. */
  statistic: number;
  lags: number;
  /** Rows used in the regression. */
  nobs: number;
  /** Finite-sample critical values for the constant-only case (MacKinnon 2010). */
  criticalValues: { '1%': number; '5%': number; '10%': number };
  /** statistic < 5% critical value: a unit root is rejected, the series is stationary around a level. */
  rejectsUnitRoot: boolean;
}

/**
 * MacKinnon (2010, "Critical values for cointegration tests", Queen's Economics Dept. Working
 * Paper 1227, Table 2, τ_c row, N = 1): c(T) = β∞ + β1/T + β2/T² + β3/T³.
 */
const TAU_C: Record<'1%' | '5%' | '10%', [number, number, number, number]> = {
  '1%': [-3.43035, -6.5393, -16.786, -79.433],
  '5%': [-2.86154, -2.8903, -4.234, -40.04],
  '10%': [-2.56677, -1.5384, -2.809, 0],
};

/**
 * Augmented Dickey–Fuller unit-root test with a constant: regresses Δx_t on 1, x_{t−1} and
 * `lags` lagged differences and reports the t-ratio of the x_{t−1} coefficient (Dickey & Fuller
 * 1979, J. Amer. Statist. Assoc. 74:427–431; Said & Dickey 1984, Biometrika 71:599–607). A value
 * above the critical value means the level wanders like a random walk and the series should be
 * differenced before its ACF is read (Box, Jenkins & Reinsel, *Time Series Analysis*, 4th ed.,
 * §10.1). Same statistic as statsmodels' `adfuller(x, maxlag=lags, autolag=None, regression="c")`.
 * Missing values are not allowed here (a regression row would straddle the gap).
 *
 * Cost: O(n · lags) time (O(n · lags²) when the regression is too ill-conditioned for the
 * cross-product route and QR takes over).
 */
export function augmentedDickeyFuller(x: Series, options: AugmentedDickeyFullerOptions = {}): AugmentedDickeyFullerResult {
  const fn = 'augmentedDickeyFuller';
  assertSeries(x, fn);
  const n = x.length;
  if (n < 10) throw new AnalysisInputError(`${fn} requires at least 10 data points (got ${n})`, { reason: 'too-few-values', need: 10, got: n });
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i])) throw new AnalysisInputError(`${fn}: value ${i} is missing or not finite`);
  }
  const maxLags = Math.floor((n - 4) / 2);
  const lags = integerOption(fn, 'lags', options.lags ?? Math.min(maxLags, Math.floor(12 * (n / 100) ** 0.25)), 0, maxLags);
  const values = x instanceof Float64Array ? x : Float64Array.from(x);
  const diff = new Float64Array(n - 1);
  for (let t = 1; t < n; t++) diff[t - 1] = values[t] - values[t - 1];
  // Row r answers Δx at diff index lags + r. The cross products come from the lag structure;
  // Householder QR on the columns themselves when they are too ill-conditioned for that route.
  const rows = n - 1 - lags;
  let shift = 0;
  for (let r = 0; r < rows; r++) shift += values[lags + r];
  shift /= rows;
  const { columns, gram, xty, yty } = dickeyFullerCrossProducts(values, diff, lags, shift);
  const y = diff.subarray(lags);
  const fit = leastSquaresFromGram(gram, xty, yty, columns, y) ?? leastSquares(columns, y);
  const statistic = fit.coefficients[0] / fit.standardErrors[0];
  const crit = (c: [number, number, number, number]) => c[0] + c[1] / rows + c[2] / rows ** 2 + c[3] / rows ** 3;
  const criticalValues = { '1%': crit(TAU_C['1%']), '5%': crit(TAU_C['5%']), '10%': crit(TAU_C['10%']) };
  return { statistic, lags, nobs: rows, criticalValues, rejectsUnitRoot: statistic < criticalValues['5%'] };
}
