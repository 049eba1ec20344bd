import { type Series } from './analysis-input-error.ts';

/**
 * Least-squares AR(1) coefficient of the mean-removed series, Σ (x_t − x̄)(x_{t−1} − x̄) /
 * Σ (x_{t−1} − x̄)²: how strongly one value carries into the next (Brockwell & Davis,
 * *Introduction to Time Series and Forecasting*, 3rd ed., §5.1, the AR(1) regression). NaN
 * values are left out of the mean, and any pair with a NaN is skipped. 0 for a constant series.
 *
 * Cost: O(n).
 */
export function lagOneCoefficient(x: Series): number {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < x.length; i++) {
    if (Number.isNaN(x[i])) continue;
    sum += x[i];
    count++;
  }
  const mean = count > 0 ? sum / count : 0;
  let cross = 0;
  let square = 0;
  for (let i = 1; i < x.length; i++) {
    const a = x[i - 1] - mean;
    const b = x[i] - mean;
    if (Number.isNaN(a) || Number.isNaN(b)) continue;
    cross += a * b;
    square += a * a;
  }
  return square > 0 ? cross / square : 0;
}
