import { CUTOFF_LOW } from './loess-thresholds.ts';
import { loessTricubeWeights } from './loess-tricube-weights.ts';

// Tricube weights by integer distance for the radius `tableRadius`, filled on demand. Most
// calls in a sweep share one radius, so each weight is computed once instead of per call.
let tableRadius = NaN;
let tableReach = 0;
let tableFilled = 0;
let table = new Float64Array(64);

function tricubeTable(h: number, maxDist: number): Float64Array {
  if (h !== tableRadius) {
    tableRadius = h;
    tableFilled = 0;
  }
  if (maxDist < tableFilled) return table;
  if (maxDist >= table.length) {
    const grown = new Float64Array(Math.max(maxDist + 1, 2 * table.length));
    grown.set(table.subarray(0, tableFilled));
    table = grown;
  }
  tableReach = loessTricubeWeights(h, tableFilled, maxDist, table);
  tableFilled = maxDist + 1;
  return table;
}

/**
 * Loess estimate at one position: the value at `xs` of a locally weighted polynomial
 * (degree 0 or 1) fitted to `y[left .. right]` with tricube neighbourhood weights, optionally
 * multiplied by robustness weights. Returns NaN when every weight is zero, so that the caller
 * can fall back as the reference implementation does.
 *
 * Method: Cleveland (1979), "Robust locally weighted regression and smoothing scatterplots",
 * JASA 74:829–836, as specialised for STL in Cleveland, Cleveland, McRae & Terpenning (1990),
 * J. Official Statistics 6(1):3–73, §2.1 and the appendix: positions are the integers, the
 * neighbourhood radius is the distance from `xs` to the farther window end, widened by
 * `floor((span - n) / 2)` when the span exceeds the series, points beyond 0.999 of the radius
 * get no weight, and the local line is skipped when the weighted spread of the positions is
 * below 0.001 of the series range.
 *
 * Indices are zero-based and `xs` is an integer that may lie outside `[left, right]`
 * (extrapolation at the ends of a cycle-subseries). Cost: O(right − left), no allocation once
 * the internal weight table has grown to the window size.
 */
export function loessEstimate(
  y: Float64Array,
  n: number,
  span: number,
  degree: number,
  xs: number,
  left: number,
  right: number,
  robustWeights: Float64Array | null,
): number {
  let h = Math.max(xs - left, right - xs);
  if (span > n) h += Math.floor((span - n) / 2);
  const w = tricubeTable(h, Math.max(xs - left, right - xs));
  const lo = Math.max(left, xs - tableReach);
  const hi = Math.min(right, xs + tableReach);
  if (lo > hi) return NaN;
  let sw = 0;
  let sy = 0;
  if (degree === 0) {
    for (let j = lo; j <= hi; j++) {
      const d = j - xs;
      let wj = w[d < 0 ? -d : d];
      if (robustWeights !== null) wj *= robustWeights[j];
      sw += wj;
      sy += wj * y[j];
    }
    return sw > 0 ? sy / sw : NaN;
  }
  // Offsets from xs; the sums below are the moments of the weighted least-squares line.
  let sd = 0;
  let sdd = 0;
  let sdy = 0;
  for (let j = lo; j <= hi; j++) {
    const d = j - xs;
    let wj = w[d < 0 ? -d : d];
    if (robustWeights !== null) wj *= robustWeights[j];
    const wd = wj * d;
    const wy = wj * y[j];
    sw += wj;
    sy += wy;
    sd += wd;
    sdd += wd * d;
    sdy += wy * d;
  }
  if (!(sw > 0)) return NaN;
  const mean = sy / sw;
  if (h <= 0) return mean;
  const centre = sd / sw;
  const spread = sdd / sw - centre * centre;
  if (!(Math.sqrt(spread) > CUTOFF_LOW * (n - 1))) return mean;
  // Fitted line at xs: mean + slope · (xs − centre), with xs at offset 0.
  const slope = (sdy / sw - centre * mean) / spread;
  return mean - slope * centre;
}
