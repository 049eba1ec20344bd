/**
 * The one error type the numeric engine throws: the caller passed a series or an option
 * the method cannot work with (too short, a lag beyond the data, a period below 2 ...).
 *
 * The engine imports nothing from the rest of the server, so the HTTP layer maps this
 * class to a 400 response itself; the message is written for the person who chose the
 * parameters, e.g. `acf: maxLag must be below the series length (got 500 for 120 values)`.
 */
export class AnalysisInputError extends Error {
  override readonly name = 'AnalysisInputError';
}

/** A numeric series as the engine accepts it; NaN marks a missing value. */
export type Series = ArrayLike<number>;

/**
 * Copies a series into a fresh Float64Array so that no engine function can mutate its input,
 * after checking that it has at least `minLength` values.
 */
export function toFloat64(x: Series, fn: string, minLength = 1): Float64Array {
  if (x == null || typeof (x as ArrayLike<number>).length !== 'number') {
    throw new AnalysisInputError(`${fn}: the series must be an array of numbers`);
  }
  if (x.length < minLength) {
    throw new AnalysisInputError(`${fn} requires at least ${minLength} data point${minLength === 1 ? '' : 's'} (got ${x.length})`);
  }
  return Float64Array.from(x as ArrayLike<number>);
}

/** Throws unless `x` is array-like (the first check every engine function makes). */
export function assertSeries(x: unknown, fn: string): asserts x is ArrayLike<number> {
  if (x == null || typeof (x as ArrayLike<number>).length !== 'number') {
    throw new AnalysisInputError(`${fn}: the series must be an array of numbers`);
  }
}

/** How many values are present (not NaN) and their sum, after checking the series is array-like. */
export function presentValues(x: unknown, fn: string): { n: number; sum: number } {
  assertSeries(x, fn);
  let n = 0;
  let sum = 0;
  for (let i = 0; i < x.length; i++) {
    const v = x[i];
    if (!Number.isNaN(v)) {
      n++;
      sum += v;
    }
  }
  return { n, sum };
}
