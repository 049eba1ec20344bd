import { AnalysisInputError } from './analysis-input-error.ts';
import { medianInPlace } from './median-in-place.ts';

/** Hampel's consistency factor: 1.4826 · MAD estimates σ for normal data (Rousseeuw & Croux 1993, JASA 88:1273). */
const MAD_TO_SD = 1.4826;

/** Remainder values pooled per position in the cycle before its median and spread are taken (our rule). */
export const DEFAULT_MIN_POOL = 60;

export interface RemainderOutlierOptions {
  /** Cells per cycle (the decomposition's period); at least 2. */
  period: number;
  /** A cell is an outlier beyond this many robust SDs of its position in the cycle (e.g. 3). */
  threshold: number;
  /** Fewest remainder values behind each position's median and spread (default 60). */
  minPool?: number;
}

export interface RemainderOutlierList {
  threshold: number;
  /** Median of the whole remainder (for display; the rule uses `phaseMedian`). */
  median: number;
  /** 1.4826 · MAD of the whole remainder (for display; the rule uses `phaseSpread`). */
  robustSd: number;
  /** Positions in the cycle pooled on each side of a position (0: each position on its own). */
  pooledPhases: number;
  /** Median of the pooled remainder at each position in the cycle (cell i has position i mod period). */
  phaseMedian: Float64Array;
  /** 1.4826 · MAD of the pooled remainder at each position in the cycle. */
  phaseSpread: Float64Array;
  /** Cells with |remainder − phaseMedian| > threshold · phaseSpread, in order. */
  indices: number[];
}

/** Median and 1.4826 · MAD of `values[0 .. count−1]` (rearranges them). */
function medianAndSpread(values: Float64Array, count: number): [number, number] {
  const median = medianInPlace(values, count);
  for (let i = 0; i < count; i++) values[i] = Math.abs(values[i] - median);
  return [median, MAD_TO_SD * medianInPlace(values, count)];
}

/**
 * Outliers of a decomposition's remainder, each cell judged against the remainder's own robust
 * spread at its position in the cycle: |r_i − m_j| > k · 1.4826 · MAD_j, where j = i mod period
 * and m_j, MAD_j are the median and median absolute deviation of the remainder at positions
 * j − h … j + h (around the cycle's end, which in time joins its start), h the smallest that pools
 * at least `minPool` values.
 *
 * Method: Hampel's identifier, the median ± k · 1.4826 · MAD rule (Hampel 1974, JASA 69:383–393;
 * 1.4826 from Rousseeuw & Croux 1993, JASA 88:1273–1283), applied over a window as in the
 * Hampel filter (Pearson 2002, IEEE Trans. Control Systems Technology 10:55–63; from memory) —
 * here the window runs over the position in the cycle instead of time (our rule). A remainder
 * whose spread follows the cycle (light by day and none at night; a temperature whose daily
 * peak varies with the weather) then has its daily peaks judged against the spread of other
 * days' peaks, not against the quiet night, so a clean cycle yields next to no outliers while a
 * spike stands out at any hour. NaN cells (the classical trend's ends) are skipped and never
 * flagged; a position whose spread is 0 flags nothing.
 *
 * Cost: O(n · (2h + 1)) time (expected, selection medians), O(n) memory.
 */
export function remainderOutliers(remainder: Float64Array, options: RemainderOutlierOptions): RemainderOutlierList {
  const { period, threshold } = options;
  const minPool = options.minPool ?? DEFAULT_MIN_POOL;
  if (!Number.isInteger(period) || period < 2) throw new AnalysisInputError(`remainderOutliers: period must be a whole number of at least 2 (got ${period})`);
  if (!(threshold > 0)) throw new AnalysisInputError(`remainderOutliers: threshold must be positive (got ${threshold})`);
  if (!Number.isInteger(minPool) || minPool < 1)
    throw new AnalysisInputError(`remainderOutliers: minPool must be a whole number of at least 1 (got ${minPool})`);
  const n = remainder.length;

  // values grouped by position in the cycle, in time order
  const byPhase: number[][] = Array.from({ length: period }, () => []);
  const all = new Float64Array(n);
  let present = 0;
  for (let i = 0; i < n; i++) {
    const v = remainder[i];
    if (Number.isNaN(v)) continue;
    byPhase[i % period].push(v);
    all[present++] = v;
  }
  const [median, robustSd] = present > 0 ? medianAndSpread(all, present) : [NaN, NaN];

  const cycles = Math.max(1, Math.floor(present / period));
  const pooledPhases = Math.min(Math.floor((period - 1) / 2), Math.max(0, Math.ceil((minPool / cycles - 1) / 2)));
  const phaseMedian = new Float64Array(period).fill(NaN);
  const phaseSpread = new Float64Array(period).fill(NaN);
  const pool = new Float64Array(Math.min(present, (2 * pooledPhases + 1) * (Math.ceil(n / period) + 1)));
  for (let j = 0; j < period; j++) {
    let count = 0;
    for (let d = -pooledPhases; d <= pooledPhases; d++) {
      for (const v of byPhase[(((j + d) % period) + period) % period]) pool[count++] = v;
    }
    if (count > 0) [phaseMedian[j], phaseSpread[j]] = medianAndSpread(pool, count);
  }

  const indices: number[] = [];
  for (let i = 0; i < n; i++) {
    const v = remainder[i];
    const j = i % period;
    if (!Number.isNaN(v) && phaseSpread[j] > 0 && Math.abs(v - phaseMedian[j]) > threshold * phaseSpread[j]) indices.push(i);
  }
  return { threshold, median, robustSd, pooledPhases, phaseMedian, phaseSpread, indices };
}
