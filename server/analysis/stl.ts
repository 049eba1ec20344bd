import { AnalysisInputError, toFloat64, type Series } from './analysis-input-error.ts';
import { robustnessWeights } from './robustness-weights.ts';
import { stlInnerLoop, type StlWorkspace } from './stl-inner-loop.ts';
import { stlParameters, type StlOptions } from './stl-parameters.ts';

export type { StlOptions } from './stl-parameters.ts';

/** The three components (they add up to the series) and the final robustness weights. */
export interface StlResult {
  seasonal: Float64Array;
  trend: Float64Array;
  remainder: Float64Array;
  /** Robustness weight of each observation in the last pass (all 1 without robust passes). */
  weights: Float64Array;
}

/**
 * Seasonal-trend decomposition by loess (STL): splits a series into a seasonal component
 * that may change slowly from cycle to cycle, a smooth trend and a remainder, optionally
 * down-weighting outliers so that they end up in the remainder instead of bending the other
 * two.
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend
 * Decomposition Procedure Based on Loess", Journal of Official Statistics 6(1):3–73, with
 * the defaults and numerics of the authors' reference code as R's `stats::stl` runs it
 * (see {@link stlParameters}); with `seasonalWindow: 'periodic'` the seasonal is then
 * replaced by the mean of each position in the cycle, as R does, so it repeats exactly.
 * The robustness weights use the exact median absolute residual; R's Fortran finds it with a
 * partial sort that sometimes misses, so robust fits can differ from R's where they agree
 * with statsmodels (tests/reference: about 1e-12 of the series' range from R where R's
 * median is exact, and from statsmodels).
 *
 * The series must be complete: a NaN (missing value) or infinity throws
 * {@link AnalysisInputError}, as R's stl refuses NAs; fill or cut gaps first. It needs at
 * least two full periods (R asks for more than two; exactly two works the same way). The
 * input is not modified.
 *
 * Cost: O(passes · n · (n_s/j_s + n_l/j_l + n_t/j_t)) time for windows n_* and jumps j_*
 * (with the default jumps about 10·n per smoother and pass), O(n) memory; a robust fit adds
 * an O(n) median per outer pass.
 */
export function stl(x: Series, options: StlOptions): StlResult {
  const y = toFloat64(x, 'stl', 0);
  const n = y.length;
  const settings = stlParameters(n, options);
  const gap = firstNonFinite(y);
  if (gap >= 0) {
    throw new AnalysisInputError(`stl: the series must be complete (got ${y[gap]} at index ${gap}); fill or cut gaps first`);
  }
  const { period } = settings;
  const extended = n + 2 * period;
  const work: StlWorkspace = {
    series: new Float64Array(n),
    cycle: new Float64Array(extended),
    lowPass: new Float64Array(extended),
    scratch: new Float64Array(extended),
    subseries: { values: new Float64Array(0), weights: new Float64Array(0), smooth: new Float64Array(0) },
  };
  const seasonal = new Float64Array(n);
  const trend = new Float64Array(n);
  const weights = new Float64Array(n);

  for (let pass = 0; ; pass++) {
    stlInnerLoop(y, settings, pass === 0 ? null : weights, seasonal, trend, work);
    if (pass >= settings.outer) break;
    const residuals = work.series;
    remainderOf(y, seasonal, trend, residuals, n);
    robustnessWeights(residuals, n, weights, work.scratch);
  }
  if (settings.outer <= 0) weights.fill(1);
  if (settings.periodic) replaceByCycleMeans(seasonal, period);

  const remainder = new Float64Array(n);
  remainderOf(y, seasonal, trend, remainder, n);
  return { seasonal, trend, remainder, weights };
}

/** Sets every value to the mean of its position in the cycle (R's periodic post-step). */
function replaceByCycleMeans(seasonal: Float64Array, period: number): void {
  const n = seasonal.length;
  for (let phase = 0; phase < period; phase++) {
    let sum = 0;
    let count = 0;
    for (let i = phase; i < n; i += period) {
      sum += seasonal[i];
      count++;
    }
    const mean = sum / count;
    for (let i = phase; i < n; i += period) seasonal[i] = mean;
  }
}

// The O(n) loops live in small functions so that V8 optimises each on its own (see
// stl-inner-loop.ts).

/** Index of the first NaN or infinite value, or −1. */
function firstNonFinite(y: Float64Array): number {
  for (let i = 0; i < y.length; i++) if (!Number.isFinite(y[i])) return i;
  return -1;
}

/** `out[i] = y[i] − seasonal[i] − trend[i]`. */
function remainderOf(y: Float64Array, seasonal: Float64Array, trend: Float64Array, out: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) out[i] = y[i] - seasonal[i] - trend[i];
}
