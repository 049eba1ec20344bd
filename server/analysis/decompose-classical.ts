import { AnalysisInputError, toFloat64, type Series } from './analysis-input-error.ts';
import { movingAverageCentred } from './moving-average-centred.ts';

export type ClassicalDecompositionType = 'additive' | 'multiplicative';

export interface ClassicalDecompositionOptions {
  /** Observations per cycle; at least 2. */
  period: number;
  /** additive: x = trend + seasonal + remainder; multiplicative: x = trend · seasonal · remainder. */
  type: ClassicalDecompositionType;
}

export interface ClassicalDecomposition {
  /** Centred moving average; NaN for the half cycle at each end and around missing values. */
  trend: Float64Array;
  /** The seasonal figure repeated over the series. */
  seasonal: Float64Array;
  remainder: Float64Array;
  /** One value per position in the cycle, counted from the first observation; sums to 0 (additive) or averages 1 (multiplicative). */
  figure: Float64Array;
}

/**
 * Classical seasonal decomposition by moving averages: the trend is a centred moving
 * average over one cycle, the seasonal figure is the mean of the detrended values at each
 * position in the cycle, centred to sum to zero (additive) or to average one
 * (multiplicative), and the remainder is what is left.
 *
 * Method: Kendall & Stuart (1983), The Advanced Theory of Statistics vol. 3, §46; Brockwell &
 * Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §1.5.2 (method S1),
 * computed exactly as R's `stats::decompose` (position in the cycle counted from the first
 * value; NaN where the moving average is undefined). Missing values (NaN) are allowed: the
 * trend is NaN wherever its window holds one and the figure averages the values available.
 * The multiplicative model needs positive values. The input is not modified.
 *
 * Cost: O(n) time and memory.
 */
export function decomposeClassical(x: Series, options: ClassicalDecompositionOptions): ClassicalDecomposition {
  const y = toFloat64(x, 'decomposeClassical', 0);
  const { period, type } = options ?? ({} as ClassicalDecompositionOptions);
  if (typeof period !== 'number' || !Number.isFinite(period) || period < 2) {
    throw new AnalysisInputError(`decomposeClassical: period must be at least 2 (got ${String(period)})`);
  }
  if (!Number.isInteger(period)) {
    throw new AnalysisInputError(`decomposeClassical: period must be a whole number (got ${period})`);
  }
  if (type !== 'additive' && type !== 'multiplicative') {
    throw new AnalysisInputError(`decomposeClassical: type must be 'additive' or 'multiplicative' (got ${String(type)})`);
  }
  const n = y.length;
  let present = 0;
  for (let i = 0; i < n; i++) {
    const v = y[i];
    if (Number.isNaN(v)) continue;
    if (!Number.isFinite(v)) {
      throw new AnalysisInputError(`decomposeClassical: values must be finite or NaN (got ${v} at index ${i})`);
    }
    if (type === 'multiplicative' && v <= 0) {
      throw new AnalysisInputError(`decomposeClassical: the multiplicative model needs positive values (got ${v} at index ${i})`);
    }
    present++;
  }
  if (present < 2 * period) {
    const what = present === n ? 'values' : 'non-missing values';
    throw new AnalysisInputError(`decomposeClassical requires at least two full periods (got ${present} ${what} for period ${period})`, {
      reason: 'too-few-periods',
      need: 2 * period,
      got: present,
      period,
    });
  }

  const multiplicative = type === 'multiplicative';
  const trend = movingAverageCentred(y, period);
  // Mean detrended value per position in the cycle, summed in one pass in time order.
  const figure = new Float64Array(period);
  const counts = new Float64Array(period);
  for (let i = 0, phase = 0; i < n; i++) {
    const detrended = multiplicative ? y[i] / trend[i] : y[i] - trend[i];
    if (!Number.isNaN(detrended)) {
      figure[phase] += detrended;
      counts[phase]++;
    }
    if (++phase === period) phase = 0;
  }
  for (let phase = 0; phase < period; phase++) figure[phase] /= counts[phase];
  let centre = 0;
  for (let phase = 0; phase < period; phase++) centre += figure[phase];
  centre /= period;
  for (let phase = 0; phase < period; phase++) {
    figure[phase] = multiplicative ? figure[phase] / centre : figure[phase] - centre;
  }

  const seasonal = new Float64Array(n);
  const remainder = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = figure[i % period];
    seasonal[i] = s;
    remainder[i] = multiplicative ? y[i] / s / trend[i] : y[i] - s - trend[i];
  }
  return { trend, seasonal, remainder, figure };
}
