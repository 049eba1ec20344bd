/** A series split into its values (missing ones set to zero) and an indicator of presence. */
export interface MaskedSeries {
  /** The values, with each missing value (NaN) replaced by 0 so it drops out of every sum. */
  values: Float64Array;
  /** 1 where a value is present, 0 where it is missing; null when nothing is missing. */
  present: Float64Array | null;
  /** How many values are present. */
  count: number;
  /** Mean of the present values (NaN when none is present). */
  mean: number;
}

/**
 * Splits a series into zero-filled values and a presence indicator, subtracting the mean of the
 * present values first when `demean` is set. This is how R's `acf(..., na.action = na.pass)`
 * treats gaps: a product with a missing factor is left out of the lagged sum (R Core Team,
 * `src/library/stats/src/filter.c`, function `acf0`; behaviour checked against R 4.2.2 in
 * tests/reference/correlation.R). Never mutates its input.
 *
 * Cost: O(n).
 */
export function maskMissing(x: ArrayLike<number>, demean: boolean): MaskedSeries {
  const n = x.length;
  let sum = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    const v = x[i];
    if (!Number.isNaN(v)) {
      sum += v;
      count++;
    }
  }
  const mean = count ? sum / count : NaN;
  const shift = demean ? mean : 0;
  const values = new Float64Array(n);
  const present = count < n ? new Float64Array(n) : null;
  for (let i = 0; i < n; i++) {
    const v = x[i];
    if (Number.isNaN(v)) continue;
    values[i] = v - shift;
    if (present) present[i] = 1;
  }
  return { values, present, count, mean };
}
