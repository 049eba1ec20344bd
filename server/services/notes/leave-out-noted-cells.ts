/** A span to leave out, epoch ms: `start` inclusive, `end` exclusive. */
export interface LeftOutSpan {
  start: number;
  end: number;
}

/** Readings in time order as columns (epoch ms, values), as grids are read. */
export interface ReadingCells {
  ts: Float64Array;
  values: Float64Array;
}

/**
 * Leaves out every reading whose grid cell overlaps one of `spans`, so those cells become
 * missing values for the engine (which skips empty cells, as R's `na.action = na.pass` does).
 * Cells are [k·step, (k+1)·step) from the epoch, as the diagnostics grid lays them out; a
 * cell only partly under a span goes whole, since its aggregate would mix noted and un-noted
 * readings. Returns the kept readings (the input untouched) and, per span, how many cells that
 * held readings it covered.
 *
 * Cost: O(n + k log k) for n readings and k spans.
 */
export function leaveOutNotedCells(data: ReadingCells, spans: readonly LeftOutSpan[], stepMs: number): { data: ReadingCells; cellsRemoved: number[] } {
  if (!(stepMs > 0)) throw new Error(`leaveOutNotedCells: stepMs must be positive (got ${stepMs})`);
  // a reading's cell overlaps [start, end) exactly when floor(start/step)·step ≤ ts < ceil(end/step)·step
  const widened = spans.map((s) => ({ from: Math.floor(s.start / stepMs) * stepMs, to: Math.ceil(s.end / stepMs) * stepMs }));
  const cellsRemoved = widened.map(({ from, to }) => countCells(data.ts, from, to, stepMs));
  if (spans.length === 0) return { data, cellsRemoved };
  const merged = [...widened].sort((a, b) => a.from - b.from);
  const n = data.ts.length;
  const keep = new Uint8Array(n);
  let kept = 0;
  let j = 0;
  for (let i = 0; i < n; i++) {
    const t = data.ts[i];
    while (j < merged.length && merged[j].to <= t) j++;
    let inside = false;
    for (let m = j; m < merged.length && merged[m].from <= t; m++) {
      if (t < merged[m].to) {
        inside = true;
        break;
      }
    }
    if (!inside) {
      keep[i] = 1;
      kept++;
    }
  }
  if (kept === n) return { data, cellsRemoved };
  const ts = new Float64Array(kept);
  const values = new Float64Array(kept);
  for (let i = 0, at = 0; i < n; i++) {
    if (!keep[i]) continue;
    ts[at] = data.ts[i];
    values[at++] = data.values[i];
  }
  return { data: { ts, values }, cellsRemoved };
}

/** Distinct cells of `stepMs` holding at least one of the sorted times in [from, to). */
function countCells(ts: Float64Array, from: number, to: number, stepMs: number): number {
  let i = lowerBound(ts, from);
  let cells = 0;
  let last = NaN;
  for (; i < ts.length && ts[i] < to; i++) {
    const cell = Math.floor(ts[i] / stepMs);
    if (cell !== last) {
      cells++;
      last = cell;
    }
  }
  return cells;
}

/** First index whose time is ≥ x (binary search on sorted times). */
function lowerBound(ts: Float64Array, x: number): number {
  let lo = 0;
  let hi = ts.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (ts[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
