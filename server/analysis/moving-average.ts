/**
 * Running mean of `span` consecutive values: `out[i] = mean(x[i .. i + span - 1])` for
 * `i = 0 .. n - span`, so `out` receives `n - span + 1` values.
 *
 * This is the simple moving average that STL's low-pass filter applies three times
 * (Cleveland, Cleveland, McRae & Terpenning 1990, "STL: A Seasonal-Trend Decomposition
 * Procedure Based on Loess", J. Official Statistics 6(1), §2.2 step 3). It keeps one running
 * sum, as the paper's reference implementation does, so the cost is O(n) whatever the span.
 * The caller guarantees `1 <= span <= n` and that `out` holds `n - span + 1` values; `x` is
 * only read.
 */
export function movingAverage(x: Float64Array, n: number, span: number, out: Float64Array): void {
  let sum = 0;
  for (let i = 0; i < span; i++) sum += x[i];
  out[0] = sum / span;
  const count = n - span + 1;
  for (let i = 1; i < count; i++) {
    sum += x[i + span - 1] - x[i - 1];
    out[i] = sum / span;
  }
}
