import { AnalysisInputError, type Series } from './analysis-input-error.ts';

export type RegularizeAggregate = 'mean' | 'last' | 'min' | 'max' | 'median' | 'sum' | 'count';

export interface RegularizeOptions {
  /** Grid spacing in milliseconds. */
  step: number;
  /** How the readings that fall in one cell become its value. */
  agg: RegularizeAggregate;
  /**
   * A time the grid passes through (epoch ms); default 0, so cells line up with whole steps of
   * UTC (whole minutes, hours …) and two channels regularized alike share their grid.
   */
  origin?: number;
}

export interface RegularizedSeries {
  /** Epoch ms of the first cell's left edge; cell i covers [start + i·step, start + (i+1)·step). */
  start: number;
  step: number;
  /** One value per cell; NaN where a cell holds no reading (for every aggregate, count included). */
  values: Float64Array;
}

const AGGREGATES: readonly RegularizeAggregate[] = ['mean', 'last', 'min', 'max', 'median', 'sum', 'count'];

/** At most this many cells: a mistyped step (1 ms over a year) should fail fast, not exhaust memory. */
const MAX_CELLS = 50_000_000;

/**
 * Puts irregular, possibly unsorted logger readings on a regular time grid, the form every
 * correlation method here assumes (equally spaced observations: Box, Jenkins & Reinsel,
 * *Time Series Analysis*, 4th ed., §1.1). Each reading goes to the cell containing its
 * timestamp; cells are aggregated with `agg` ('last' takes the reading with the latest
 * timestamp, the later one in input order on a tie; 'median' averages the two middle values
 * of an even count). Readings whose value is NaN are ignored; a cell without readings is NaN.
 *
 * Cost: O(n + cells) time by a counting sort on the cell index, plus O(m log m) per cell of
 * m readings for 'median'.
 */
export function regularize(timestamps: Series, values: Series, options: RegularizeOptions): RegularizedSeries {
  const fn = 'regularize';
  if (timestamps == null || values == null || typeof timestamps.length !== 'number' || typeof values.length !== 'number') {
    throw new AnalysisInputError(`${fn}: timestamps and values must be arrays of numbers`);
  }
  if (timestamps.length !== values.length) {
    throw new AnalysisInputError(`${fn}: timestamps and values must have the same length (got ${timestamps.length} and ${values.length})`);
  }
  const { step, agg, origin = 0 } = options ?? ({} as RegularizeOptions);
  if (!(Number.isFinite(step) && step > 0)) {
    throw new AnalysisInputError(`${fn}: step must be a positive number of milliseconds (got ${step})`);
  }
  if (!AGGREGATES.includes(agg)) {
    throw new AnalysisInputError(`${fn}: agg must be one of ${AGGREGATES.join(', ')} (got ${String(agg)})`);
  }
  if (!Number.isFinite(origin)) throw new AnalysisInputError(`${fn}: origin must be a finite number (got ${origin})`);

  let first = Infinity;
  let last = -Infinity;
  let readings = 0;
  for (let i = 0; i < timestamps.length; i++) {
    const t = timestamps[i];
    if (!Number.isFinite(t)) throw new AnalysisInputError(`${fn}: timestamp ${i} is not a finite number (got ${t})`);
    if (Number.isNaN(values[i])) continue;
    readings++;
    if (t < first) first = t;
    if (t > last) last = t;
  }
  if (readings === 0) throw new AnalysisInputError(`${fn} requires at least 1 reading with a value (got 0)`, { reason: 'too-few-values', need: 1, got: 0 });

  const start = origin + Math.floor((first - origin) / step) * step;
  const cells = Math.floor((last - start) / step) + 1;
  if (cells > MAX_CELLS) {
    throw new AnalysisInputError(`${fn}: step ${step} ms gives ${cells} cells, more than ${MAX_CELLS}; use a larger step`, {
      reason: 'too-many-cells',
      need: MAX_CELLS,
      got: cells,
    });
  }

  // Counting sort of the readings by cell.
  const cellOf = new Int32Array(timestamps.length);
  const offsets = new Int32Array(cells + 1);
  let previousCell = -1;
  let onePerCellInOrder = true;
  for (let i = 0; i < timestamps.length; i++) {
    if (Number.isNaN(values[i])) {
      cellOf[i] = -1;
      continue;
    }
    const c = Math.min(cells - 1, Math.floor((timestamps[i] - start) / step));
    cellOf[i] = c;
    offsets[c + 1]++;
    if (c <= previousCell) onePerCellInOrder = false;
    previousCell = c;
  }
  if (onePerCellInOrder && agg !== 'count') {
    // Already on the grid (cells read from rollups, or one reading per step): each cell's
    // aggregate is its only reading.
    const out = new Float64Array(cells).fill(NaN);
    for (let i = 0; i < timestamps.length; i++) if (cellOf[i] >= 0) out[cellOf[i]] = values[i];
    return { start, step, values: out };
  }
  for (let c = 0; c < cells; c++) offsets[c + 1] += offsets[c];
  const order = new Int32Array(readings);
  const fill = offsets.slice(0, cells);
  for (let i = 0; i < timestamps.length; i++) if (cellOf[i] >= 0) order[fill[cellOf[i]]++] = i;

  const out = new Float64Array(cells).fill(NaN);
  const scratch: number[] = [];
  for (let c = 0; c < cells; c++) {
    const from = offsets[c];
    const to = offsets[c + 1];
    if (from === to) continue;
    out[c] = aggregateCell(agg, order, from, to, timestamps, values, scratch);
  }
  return { start, step, values: out };
}

function aggregateCell(agg: RegularizeAggregate, order: Int32Array, from: number, to: number, timestamps: Series, values: Series, scratch: number[]): number {
  switch (agg) {
    case 'count':
      return to - from;
    case 'sum':
    case 'mean': {
      let s = 0;
      for (let j = from; j < to; j++) s += values[order[j]];
      return agg === 'sum' ? s : s / (to - from);
    }
    case 'min':
    case 'max': {
      let m = values[order[from]];
      for (let j = from + 1; j < to; j++) {
        const v = values[order[j]];
        if (agg === 'min' ? v < m : v > m) m = v;
      }
      return m;
    }
    case 'last': {
      // Readings in a cell keep their input order, so `>=` picks the later of equal timestamps.
      let best = order[from];
      for (let j = from + 1; j < to; j++) if (timestamps[order[j]] >= timestamps[best]) best = order[j];
      return values[best];
    }
    case 'median': {
      scratch.length = 0;
      for (let j = from; j < to; j++) scratch.push(values[order[j]]);
      scratch.sort((a, b) => a - b);
      const mid = scratch.length >> 1;
      return scratch.length % 2 ? scratch[mid] : (scratch[mid - 1] + scratch[mid]) / 2;
    }
  }
}
