/** Median of a copy of `values` (the mean of the two middle values for an even count); NaN when empty. */
export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  if (n === 0) return NaN;
  const mid = n >> 1;
  return n % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * Robust location and scale of a sample: the median, and the median absolute deviation from
 * it times 1.4826, which makes it estimate the standard deviation of normally distributed data
 * (1.4826 ≈ 1/Φ⁻¹(3/4); Hampel 1974, "The influence curve and its role in robust estimation",
 * JASA 69:383–393; the same constant as R's `stats::mad`). One wild value barely moves either.
 * The input is not modified.
 *
 * Cost: O(n log n).
 */
export function robustScale(values: ArrayLike<number>): { center: number; scale: number } {
  const center = median(values);
  const deviations = Float64Array.from(values, (v) => Math.abs(v - center));
  return { center, scale: 1.4826 * median(deviations) };
}
