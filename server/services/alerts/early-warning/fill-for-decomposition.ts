/** A grid with its empty cells filled for a decomposition, and which cells were filled. */
export interface FilledGrid {
  values: Float64Array;
  /** 1 where the cell was empty and holds a filled-in value. */
  filled: Uint8Array;
}

/**
 * Fills the empty (NaN) cells of a regular grid so that STL, which needs a complete series, can
 * run: runs inside the record by a straight line between their neighbours; a run at either end
 * by the value one cycle later or earlier (the seasonal naïve value, Hyndman & Athanasopoulos,
 * *Forecasting: Principles and Practice*, 3rd ed., 2021, §5.2), or by the nearest reading when
 * the grid has no cycle or the end run is a cycle or longer. The filled cells serve the
 * decomposition only: the caller puts NaN back before fitting the model, which the Kalman filter
 * then passes by prediction alone. Null when no cell holds a reading. The input is not changed.
 *
 * Cost: O(n).
 */
export function fillForDecomposition(grid: ArrayLike<number>, period: number | null): FilledGrid | null {
  const n = grid.length;
  const values = Float64Array.from(grid);
  const filled = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (!Number.isFinite(values[i])) filled[i] = 1;
  let first = 0;
  while (first < n && filled[first]) first++;
  if (first === n) return null;
  let last = n - 1;
  while (filled[last]) last--;
  for (let i = first + 1; i < last; i++) {
    if (!filled[i]) continue;
    let j = i;
    while (filled[j]) j++;
    for (let m = i; m < j; m++) values[m] = values[i - 1] + ((values[j] - values[i - 1]) * (m - i + 1)) / (j - i + 1);
    i = j;
  }
  const seasonalEnds = period !== null && period >= 2 && first < period && n - 1 - last < period && last - first + 1 >= period;
  for (let i = last + 1; i < n; i++) values[i] = seasonalEnds ? values[i - period!] : values[last];
  for (let i = first - 1; i >= 0; i--) values[i] = seasonalEnds ? values[i + period!] : values[first];
  return { values, filled };
}
