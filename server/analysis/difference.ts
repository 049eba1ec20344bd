import { AnalysisInputError, type Series, assertSeries } from './analysis-input-error.ts';
import { integerOption } from './integer-option.ts';

export interface DifferenceOptions {
  /** Distance between the readings subtracted (default 1; a season length for seasonal differences). */
  lag?: number;
  /** How many times to difference (default 1). */
  order?: number;
}

/**
 * Lagged differences ∇_s^d x: y_t = x_t − x_{t−s}, applied d times, the usual way to remove a
 * trend (s = 1) or a fixed seasonal pattern (s = season length) before reading the ACF
 * (Box, Jenkins & Reinsel, *Time Series Analysis*, 4th ed., §4.1 and §9.1; Brockwell & Davis,
 * *Introduction to Time Series and Forecasting*, 2nd ed., §1.5). Same values as R's
 * `diff(x, lag, differences)`; the result has n − s·d values and a missing value spreads to the
 * differences that use it. Where R returns an empty vector (s·d ≥ n) this throws.
 *
 * Cost: O(n · d) time, O(n) space.
 */
export function difference(x: Series, options: DifferenceOptions = {}): Float64Array {
  const fn = 'difference';
  assertSeries(x, fn);
  const lag = integerOption(fn, 'lag', options.lag ?? 1, 1);
  const order = integerOption(fn, 'order', options.order ?? 1, 1);
  if (lag * order >= x.length) {
    throw new AnalysisInputError(`${fn} requires more than lag × order = ${lag * order} data points (got ${x.length})`, {
      reason: 'too-few-values',
      need: lag * order + 1,
      got: x.length,
    });
  }
  let current = Float64Array.from(x);
  for (let d = 0; d < order; d++) {
    const next = new Float64Array(current.length - lag);
    for (let t = 0; t < next.length; t++) next[t] = current[t + lag] - current[t];
    current = next;
  }
  return current;
}
