import { regularize, stl } from '../../../analysis/index.ts';
import { formatValue, type RuleMemory, type RuleReading, type RuleStep, type RuleTransition } from './rule-step.ts';
import { robustScale } from './robust-scale.ts';

/** Parameters of an unusual-reading rule. */
export interface UnusualParams {
  /** Length of the cycle in hours (24 for a daily cycle). */
  periodH: number;
  /** How many robust standard deviations a remainder may stray before a reading is unusual. */
  k: number;
  /** How many past cycles the decomposition looks back (at least 3: two to fit, one to measure the spread). */
  historyCycles: number;
}

/** At most this share of the grid cells may be empty (gaps are filled linearly). */
const MAX_GAP_SHARE = 0.2;

/** Fills interior NaN cells by straight lines between their neighbours; null if too many are empty or an end is. */
function fillGaps(values: Float64Array): Float64Array | null {
  const out = Float64Array.from(values);
  let missing = 0;
  for (let i = 0; i < out.length; i++) if (Number.isNaN(out[i])) missing++;
  if (missing > MAX_GAP_SHARE * out.length || Number.isNaN(out[0]) || Number.isNaN(out[out.length - 1])) return null;
  for (let i = 1; i < out.length; i++) {
    if (!Number.isNaN(out[i])) continue;
    let j = i;
    while (Number.isNaN(out[j])) j++;
    for (let m = i; m < j; m++) out[m] = out[i - 1] + ((out[j] - out[i - 1]) * (m - i + 1)) / (j - i + 1);
    i = j;
  }
  return out;
}

/**
 * The usual value of each later grid cell, from a robust STL fit of `series[0, upto)` (Cleveland,
 * Cleveland, McRae & Terpenning 1990, "STL: A Seasonal-Trend Decomposition Procedure Based on
 * Loess", J. Official Statistics 6(1):3–73; periodic seasonal, with the paper's robustness
 * passes, so past outliers stay in the remainder): the seasonal value at the cell's place in
 * the cycle plus the trend level at the end of the fit, held flat.
 */
function usualAfter(series: Float64Array, upto: number, periodSteps: number): (cell: number) => number {
  const fit = stl(series.subarray(0, upto), { period: periodSteps, seasonalWindow: 'periodic', robust: true });
  const lastCycle = upto - periodSteps;
  const level = fit.trend[upto - 1];
  return (cell) => fit.seasonal[lastCycle + ((((cell - lastCycle) % periodSteps) + periodSteps) % periodSteps)] + level;
}

/**
 * How unusual each new reading is, in robust standard deviations. The readings before the
 * first new one are put on a grid of `stepMs` (cell means, {@link regularize}) with short gaps
 * filled by straight lines. A reading's remainder is its value minus the usual value of its
 * cell from the STL fit of that history ({@link usualAfter}). The spread is measured the same
 * way, out of sample: the history without its last cycle is fitted, that cycle's remainders
 * are taken, and their median and 1.4826 · MAD ({@link robustScale}; Hampel 1974) are the
 * centre and the robust SD — fitted remainders would understate it, as the fit has adapted to
 * them. The score is (remainder − centre) / robust SD; ±Infinity when the SD is zero and the
 * reading differs. Null when the history holds fewer than three cycles of cells or more than
 * a fifth of them are empty. Readings must come after the history; nothing is modified.
 *
 * Cost: two STL fits of the history, O(n) for n grid cells (see {@link stl}).
 */
export function unusualScores(
  history: { ts: ArrayLike<number>; values: ArrayLike<number> },
  readings: readonly RuleReading[],
  stepMs: number,
  periodSteps: number,
): Float64Array | null {
  if (periodSteps < 2 || history.ts.length < 3 * periodSteps || readings.length === 0) return null;
  const grid = regularize(history.ts, history.values, { step: stepMs, agg: 'mean' });
  const filled = fillGaps(grid.values);
  const n = filled?.length ?? 0;
  if (!filled || n < 3 * periodSteps) return null;
  const heldOut = usualAfter(filled, n - periodSteps, periodSteps);
  const errors = Float64Array.from({ length: periodSteps }, (_, j) => filled[n - periodSteps + j] - heldOut(n - periodSteps + j));
  const { center, scale } = robustScale(errors);
  const usual = usualAfter(filled, n, periodSteps);
  return Float64Array.from(readings, (r) => {
    const deviation = r.value - usual(Math.floor((r.ts - grid.start) / stepMs)) - center;
    if (scale === 0) return deviation === 0 ? 0 : Math.sign(deviation) * Infinity;
    return deviation / scale;
  });
}

/**
 * Unusual-reading rule: opens at the first reading whose score ({@link unusualScores}) lies
 * beyond `k` robust standard deviations (so the usual afternoon peak, which the seasonal
 * component carries, does not count, and an abnormal one does); resolves at the first later
 * reading within `k`. Without scores (too little history) nothing is judged. Pure.
 *
 * Cost: O(n) in the number of readings once they are scored.
 */
export function evaluateUnusualReading(
  params: UnusualParams,
  scores: ArrayLike<number> | null,
  memory: RuleMemory,
  readings: readonly RuleReading[],
): RuleStep {
  let { open } = memory;
  const transitions: RuleTransition[] = [];
  const previous = readings.at(-1) ?? memory.previous;
  if (!scores) return { memory: { ...memory, previous }, transitions };
  for (let i = 0; i < readings.length; i++) {
    const r = readings[i];
    const score = scores[i];
    const unusual = Math.abs(score) > params.k;
    const sd = Number.isFinite(score) ? `${formatValue(Math.abs(score))} robust SD` : 'infinitely many robust SD';
    if (unusual && !open) {
      open = true;
      transitions.push({
        kind: 'open',
        ts: r.ts,
        value: r.value,
        detail: `${formatValue(r.value)} lies ${sd} ${score > 0 ? 'above' : 'below'} the usual pattern (limit ${formatValue(params.k)})`,
      });
    } else if (!unusual && open) {
      open = false;
      transitions.push({ kind: 'resolve', ts: r.ts, value: r.value, detail: `${formatValue(r.value)} fits the usual pattern again` });
    }
  }
  return { memory: { pendingSince: null, previous, open }, transitions };
}
