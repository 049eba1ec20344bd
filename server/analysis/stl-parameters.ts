import { AnalysisInputError } from './analysis-input-error.ts';

/** Options of {@link stl}; every window and jump is counted in observations. */
export interface StlOptions {
  /** Observations per cycle (24 for hourly readings with a daily cycle); at least 2. */
  period: number;
  /** Span of the cycle-subseries smoother, or 'periodic' for a seasonal that repeats exactly. */
  seasonalWindow: 'periodic' | number;
  /** Add the paper's outer loop of robustness weights (default false). */
  robust?: boolean;
  seasonalDegree?: 0 | 1;
  trendWindow?: number;
  trendDegree?: 0 | 1;
  lowpassWindow?: number;
  lowpassDegree?: 0 | 1;
  seasonalJump?: number;
  trendJump?: number;
  lowpassJump?: number;
  /** Passes of the inner loop (default 2, or 1 when robust). */
  inner?: number;
  /** Robustness passes of the outer loop (default 0, or 15 when robust). */
  outer?: number;
}

/** Every STL parameter resolved; windows are odd and at least 3, as the smoothers need. */
export interface StlSettings {
  period: number;
  periodic: boolean;
  seasonalWindow: number;
  seasonalDegree: number;
  seasonalJump: number;
  trendWindow: number;
  trendDegree: number;
  trendJump: number;
  lowpassWindow: number;
  lowpassDegree: number;
  lowpassJump: number;
  inner: number;
  outer: number;
}

/**
 * Checks STL's options for a series of `n` values and fills in the defaults of Cleveland,
 * Cleveland, McRae & Terpenning (1990), J. Official Statistics 6(1):3–73, §3, exactly as R's
 * `stats::stl` applies them, so the same call gives the same decomposition in both:
 * trend window `nextodd(ceil(1.5·period / (1 − 1.5 / seasonalWindow)))`, low-pass window
 * `nextodd(period)` with the trend's degree, seasonal degree 0, trend degree 1, each jump
 * `ceil(window / 10)`, and inner/outer passes 2/0 (1/15 when robust). 'periodic' stands for a
 * seasonal window of `10·n + 1` with degree 0. An even window is raised to the next odd
 * number, as the reference code does. Throws {@link AnalysisInputError} on a bad option.
 * Cost: O(1).
 */
export function stlParameters(n: number, options: StlOptions): StlSettings {
  const period = options?.period;
  if (typeof period !== 'number' || !Number.isFinite(period)) {
    throw new AnalysisInputError(`stl: period must be a number (got ${String(period)})`);
  }
  if (period < 2) throw new AnalysisInputError(`stl: period must be at least 2 (got ${period})`);
  if (!Number.isInteger(period)) {
    throw new AnalysisInputError(`stl: period must be a whole number (got ${period})`);
  }
  if (n < 2 * period) {
    throw new AnalysisInputError(`stl requires at least two full periods (got ${n} value${n === 1 ? '' : 's'} for period ${period})`, {
      reason: 'too-few-periods',
      need: 2 * period,
      got: n,
      period,
    });
  }
  const robust = options.robust ?? false;
  if (typeof robust !== 'boolean') throw new AnalysisInputError(`stl: robust must be true or false`);

  const periodic = options.seasonalWindow === 'periodic';
  const seasonalWindow = periodic ? 10 * n + 1 : whole('seasonalWindow', options.seasonalWindow, 3);
  const seasonalDegree = periodic ? 0 : degree('seasonalDegree', options.seasonalDegree, 0);
  const trendDegree = degree('trendDegree', options.trendDegree, 1);
  const lowpassDegree = degree('lowpassDegree', options.lowpassDegree, trendDegree);
  const trendWindow =
    options.trendWindow === undefined ? nextOdd(Math.ceil((1.5 * period) / (1 - 1.5 / seasonalWindow))) : whole('trendWindow', options.trendWindow, 3);
  const lowpassWindow = options.lowpassWindow === undefined ? nextOdd(period) : whole('lowpassWindow', options.lowpassWindow, 3);
  const jump = (name: string, given: unknown, window: number) => (given === undefined ? Math.ceil(window / 10) : whole(name, given, 1));

  return {
    period,
    periodic,
    seasonalWindow: oddAtLeastThree(seasonalWindow),
    seasonalDegree,
    seasonalJump: jump('seasonalJump', options.seasonalJump, seasonalWindow),
    trendWindow: oddAtLeastThree(trendWindow),
    trendDegree,
    trendJump: jump('trendJump', options.trendJump, trendWindow),
    lowpassWindow: oddAtLeastThree(lowpassWindow),
    lowpassDegree,
    lowpassJump: jump('lowpassJump', options.lowpassJump, lowpassWindow),
    inner: options.inner === undefined ? (robust ? 1 : 2) : whole('inner', options.inner, 1),
    outer: options.outer === undefined ? (robust ? 15 : 0) : whole('outer', options.outer, 0),
  };
}

function whole(name: string, value: unknown, min: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min) {
    const what = name === 'seasonalWindow' ? `'periodic' or a whole number` : 'a whole number';
    throw new AnalysisInputError(`stl: ${name} must be ${what} of at least ${min} (got ${String(value)})`);
  }
  return value;
}

function degree(name: string, value: unknown, fallback: number): number {
  if (value === undefined) return fallback;
  if (value !== 0 && value !== 1) throw new AnalysisInputError(`stl: ${name} must be 0 or 1 (got ${String(value)})`);
  return value;
}

/** R's `nextodd` inside stats::stl: round half to even, then step up to the next odd value. */
function nextOdd(x: number): number {
  let r = Math.round(x);
  if (Math.abs(x % 1) === 0.5 && r % 2 !== 0) r -= 1;
  return r % 2 === 0 ? r + 1 : r;
}

function oddAtLeastThree(window: number): number {
  const w = Math.max(3, window);
  return w % 2 === 0 ? w + 1 : w;
}
