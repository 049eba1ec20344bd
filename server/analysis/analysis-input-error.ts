/**
 * Why the engine refused its input, as a word callers can switch on (the HTTP layer turns it
 * into plain words for people; the message stays for developers):
 * - `too-few-values`: the series is shorter than the method needs (`need`, `got` values);
 * - `too-few-cells`: readings fell in fewer grid cells than the method needs;
 * - `too-few-after-differencing`: differencing left fewer values than the method needs;
 * - `too-few-pairs`: two channels share fewer times with a value than needed;
 * - `too-few-periods`: a decomposition needs two full cycles (`need`, `got` values; `period`);
 * - `too-few-in-range`: one range of a comparison holds too few values (`range` 'a' or 'b');
 * - `too-few-independent`: the readings of a range follow each other so closely that they count
 *   as fewer independent readings (`got`, a fraction) than an interval needs (`need`);
 * - `period-too-long`: a chosen period longer than half the series (`need` is the longest allowed);
 * - `no-period`: seasonal differencing without a period given or found;
 * - `constant`: the values never change, so the statistic is undefined;
 * - `straight-line`: the values lie exactly on a line, so a slope has no sampling error;
 * - `too-many-cells`: the step makes more grid cells than one run may hold;
 * - `unstable-model`: the fitted model has a unit root or is not stationary;
 * - `bad-option`: an option outside its domain (a programming error, or a value the route let through).
 */
export type AnalysisInputReason =
  | 'too-few-values'
  | 'too-few-cells'
  | 'too-few-after-differencing'
  | 'too-few-pairs'
  | 'too-few-periods'
  | 'too-few-in-range'
  | 'too-few-independent'
  | 'period-too-long'
  | 'no-period'
  | 'constant'
  | 'straight-line'
  | 'too-many-cells'
  | 'unstable-model'
  | 'bad-option';

/** The typed part of an AnalysisInputError: the reason and, where one applies, the counts behind it. */
export interface AnalysisInputDetail {
  reason: AnalysisInputReason;
  /** How many values (cells, pairs …) the method needs, or the largest allowed for `period-too-long`. */
  need?: number;
  /** How many the input gave. */
  got?: number;
  /** The seasonal period in steps, where the refusal depends on it. */
  period?: number;
  /** The comparison range the refusal is about. */
  range?: 'a' | 'b';
}

/**
 * The one error type the numeric engine throws: the caller passed a series or an option
 * the method cannot work with (too short, a lag beyond the data, a period below 2 ...).
 *
 * The engine imports nothing from the rest of the server, so the HTTP layer maps this
 * class to a 400/422 answer itself. The message is for developers
 * (`acf: maxLag must be below the series length (got 500 for 120 values)`); `detail` carries
 * the typed reason and counts, from which the service writes the sentence people read, so no
 * caller ever parses the message. Without a detail the reason is `bad-option`.
 */
export class AnalysisInputError extends Error {
  override readonly name = 'AnalysisInputError';
  readonly detail: AnalysisInputDetail;

  constructor(message: string, detail: AnalysisInputDetail = { reason: 'bad-option' }) {
    super(message);
    this.detail = detail;
  }
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
    throw new AnalysisInputError(`${fn} requires at least ${minLength} data point${minLength === 1 ? '' : 's'} (got ${x.length})`, {
      reason: 'too-few-values',
      need: minLength,
      got: x.length,
    });
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
