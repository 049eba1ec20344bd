import { loessSmooth } from './loess-smooth.ts';
import { stlLowPass } from './stl-low-pass.ts';
import type { StlSettings } from './stl-parameters.ts';
import { stlSubseriesSmooth, type SubseriesScratch } from './stl-subseries-smooth.ts';

/** Buffers reused by every pass of {@link stlInnerLoop}, sized for one series. */
export interface StlWorkspace {
  /** n values: the detrended, later the deseasonalised series. */
  series: Float64Array;
  /** n + 2·period values: the smoothed cycle-subseries, extended by one cycle at each end. */
  cycle: Float64Array;
  /** n + 2·period values each: low-pass output and scratch. */
  lowPass: Float64Array;
  scratch: Float64Array;
  /** Buffers of the cycle-subseries smoother (grown on first use). */
  subseries: SubseriesScratch;
}

/**
 * STL's inner loop: `settings.inner` passes of detrending, cycle-subseries smoothing,
 * low-pass filtering of the seasonal, deseasonalising and trend smoothing, updating
 * `season` and `trend` in place (the trend carries over from the previous call, as the
 * outer loop requires).
 *
 * Method: Cleveland, Cleveland, McRae & Terpenning (1990), "STL: A Seasonal-Trend
 * Decomposition Procedure Based on Loess", J. Official Statistics 6(1):3–73, §2.2 steps 1–6
 * (`stlstp` in netlib's stl.f). `robustWeights` is null on the first outer pass. `y` is only
 * read. Cost per pass: O(n·(n_s/j_s + n_l/j_l + n_t/j_t) + n) for windows n_* and jumps j_*.
 */
export function stlInnerLoop(
  y: Float64Array,
  settings: StlSettings,
  robustWeights: Float64Array | null,
  season: Float64Array,
  trend: Float64Array,
  work: StlWorkspace,
): void {
  const n = y.length;
  const { period } = settings;
  const { series, cycle, lowPass } = work;
  for (let pass = 0; pass < settings.inner; pass++) {
    subtract(y, trend, series, n);
    stlSubseriesSmooth(series, n, period, settings.seasonalWindow, settings.seasonalDegree, settings.seasonalJump, robustWeights, cycle, work.subseries);
    stlLowPass(cycle, n, period, settings.lowpassWindow, settings.lowpassDegree, settings.lowpassJump, lowPass, work.scratch);
    seasonalAndRest(y, cycle, period, lowPass, season, series, n);
    loessSmooth(series, n, settings.trendWindow, settings.trendDegree, settings.trendJump, robustWeights, trend, 0);
  }
}

// The O(n) steps live in their own small functions: V8 then optimises each loop on its own
// instead of on-stack-replacing a long function whose later parts it has not seen run yet.

/** `out[i] = a[i] − b[i]`. */
function subtract(a: Float64Array, b: Float64Array, out: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) out[i] = a[i] - b[i];
}

/** Step 4 and 5 of the paper: seasonal = C − L (C shifted by one period), rest = y − seasonal. */
function seasonalAndRest(
  y: Float64Array,
  cycle: Float64Array,
  period: number,
  lowPass: Float64Array,
  season: Float64Array,
  rest: Float64Array,
  n: number,
): void {
  for (let i = 0; i < n; i++) {
    const s = cycle[period + i] - lowPass[i];
    season[i] = s;
    rest[i] = y[i] - s;
  }
}
