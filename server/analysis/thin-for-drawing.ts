export interface ThinForDrawingOptions {
  /** Most points kept per series (the cells of `always` come on top). */
  maxPoints: number;
  /** Cells kept whatever their value (e.g. flagged outliers), in any order. */
  always?: ArrayLike<number>;
}

export interface ThinnedCells {
  /** Kept cell indices, ascending. */
  cells: Int32Array;
  /** Cells per bucket (1 when nothing was thinned). */
  bucketCells: number;
}

/**
 * Picks the cells worth drawing when several series of the same n cells (the components of a
 * decomposition) are far longer than a chart is wide: the cells are cut into equal buckets and
 * each bucket keeps its first and last cell and, for every series, the cells of its minimum and
 * maximum, so every peak, trough and step survives at the chart's resolution. This is the
 * min/max-per-pixel-column reduction of Jugel, Jerzak, Hackenbroich & Markl (2014), "M4: a
 * visualization-oriented time series data aggregation", Proc. VLDB Endowment 7(10):797–808,
 * with one shared set of cells so stacked panels stay aligned. The `always` cells are added.
 * NaN values never win a minimum or maximum. Returns every cell when n ≤ maxPoints.
 *
 * Cost: O(n · series) time, O(maxPoints) space.
 */
export function thinForDrawing(series: ArrayLike<number>[], n: number, options: ThinForDrawingOptions): ThinnedCells {
  const always = options.always ?? [];
  if (n <= options.maxPoints) return { cells: Int32Array.from({ length: n }, (_, i) => i), bucketCells: 1 };
  const perBucket = 2 + 2 * series.length;
  const buckets = Math.max(1, Math.floor(options.maxPoints / perBucket));
  const bucketCells = Math.ceil(n / buckets);
  const keep = new Uint8Array(n);
  for (let start = 0; start < n; start += bucketCells) {
    const end = Math.min(n, start + bucketCells);
    keep[start] = 1;
    keep[end - 1] = 1;
    for (const s of series) {
      let lo = -1;
      let hi = -1;
      for (let i = start; i < end; i++) {
        const v = s[i];
        if (Number.isNaN(v)) continue;
        if (lo < 0 || v < s[lo]) lo = i;
        if (hi < 0 || v > s[hi]) hi = i;
      }
      if (lo >= 0) keep[lo] = 1;
      if (hi >= 0) keep[hi] = 1;
    }
  }
  for (let j = 0; j < always.length; j++) {
    const i = always[j];
    if (Number.isInteger(i) && i >= 0 && i < n) keep[i] = 1;
  }
  let count = 0;
  for (let i = 0; i < n; i++) count += keep[i];
  const cells = new Int32Array(count);
  for (let i = 0, j = 0; i < n; i++) if (keep[i]) cells[j++] = i;
  return { cells, bucketCells };
}
