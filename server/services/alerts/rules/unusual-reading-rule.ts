import { regularize, stl } from '../../../analysis/index.ts';
import { readingDecimals, roughRatio } from './alert-numbers.ts';
import { formatValue, withUnit, type RuleMemory, type RuleReading, type RuleStep, type RuleTransition } from './rule-step.ts';
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

/** At most this share of the history's grid cells may be empty (they are filled for the fit). */
const MAX_GAP_SHARE = 0.2;

/**
 * Fills the empty (NaN) cells of a history grid for the decomposition, in place, and returns
 * which cells were filled. Interior runs: straight lines between their neighbours. A run at
 * either end (the logger was silent when the history began, or right before the readings being
 * judged): the value one cycle later or earlier (the seasonal naïve value; Hyndman &
 * Athanasopoulos, *Forecasting: Principles and Practice*, 3rd ed., 2021, §5.2), so a gap right
 * before a reading no longer stops it being judged. Filled cells feed the fit only: they are
 * left out when the spread is measured. Null when more than {@link MAX_GAP_SHARE} of the cells
 * are empty or an end run is a whole cycle or longer.
 */
function fillForFit(out: Float64Array, periodSteps: number): Uint8Array | null {
  const n = out.length;
  const filled = new Uint8Array(n);
  let missing = 0;
  for (let i = 0; i < n; i++) if (Number.isNaN(out[i])) filled[i] = 1;
  for (let i = 0; i < n; i++) missing += filled[i];
  if (missing > MAX_GAP_SHARE * n) return null;
  let first = 0;
  while (first < n && filled[first]) first++;
  let last = n - 1;
  while (last >= 0 && filled[last]) last--;
  if (first >= periodSteps || n - 1 - last >= periodSteps) return null;
  for (let i = first + 1; i < last; i++) {
    if (!filled[i]) continue;
    let j = i;
    while (filled[j]) j++;
    for (let m = i; m < j; m++) out[m] = out[i - 1] + ((out[j] - out[i - 1]) * (m - i + 1)) / (j - i + 1);
    i = j;
  }
  for (let i = last + 1; i < n; i++) out[i] = out[i - periodSteps];
  for (let i = first - 1; i >= 0; i--) out[i] = out[i + periodSteps];
  return filled;
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

/** Why the readings of a step could not be judged (recorded on the rule instead of a verdict). */
export interface NotJudged {
  reason: 'no-history' | 'too-little-history' | 'too-many-gaps';
  /** One sentence for people. */
  detail: string;
}

/** How unusual each new reading is: its score in robust SDs and the usual value it was compared with. */
export interface ScoredReadings {
  /** (value − usual) / robust SD per reading; ±Infinity when the spread is zero and the reading differs. */
  scores: Float64Array;
  /** The usual value at each reading's place in the cycle (seasonal + level + the centre of the remainders). */
  usual: Float64Array;
}

/** The scores of the new readings, or why there are none. */
export type UnusualScoring = (ScoredReadings & { notJudged: null }) | { scores: null; usual: null; notJudged: NotJudged };

/** Fewest cells of the last history cycle that must hold readings for the spread to be measured. */
const MIN_SPREAD_CELLS = 8;

/**
 * How unusual each new reading is, in robust standard deviations. The history is put on a grid
 * of `stepMs` (cell means, {@link regularize}) covering `window` (the time span the history was
 * read for, so cells the logger left empty at either end count as empty) or, without one, the
 * span of the history's own readings; empty cells are filled for the fit ({@link fillForFit}).
 * A reading's remainder is its value minus the usual value of its cell from the STL fit of that
 * history ({@link usualAfter}). The spread is measured the same way, out of sample: the
 * history without its last cycle is fitted, that cycle's remainders at cells that held readings
 * are taken, and their median and 1.4826 · MAD ({@link robustScale}; Hampel 1974) are the
 * centre and the robust SD — fitted remainders would understate it, as the fit has adapted to
 * them. The score is (remainder − centre) / robust SD; ±Infinity when the SD is zero and the
 * reading differs. No scores, with the reason, when the history spans fewer than three cycles,
 * more than a fifth of its cells are empty, an end of it is empty for a whole cycle, or its last
 * cycle holds fewer than {@link MIN_SPREAD_CELLS} cells with readings. Readings must come after
 * the history; nothing is modified. A history whose first whole cycle or more is empty (the
 * channel's readings begin inside the window) is too little history rather than too many gaps.
 *
 * Cost: two STL fits of the history, O(n) for n grid cells (see {@link stl}).
 */
export function unusualScores(
  history: { ts: ArrayLike<number>; values: ArrayLike<number> },
  readings: readonly RuleReading[],
  stepMs: number,
  periodSteps: number,
  window?: { from: number; to: number },
): UnusualScoring {
  const none = (reason: NotJudged['reason'], detail: string): UnusualScoring => ({ scores: null, usual: null, notJudged: { reason, detail } });
  if (history.ts.length === 0) return none('no-history', 'No readings before these to learn the usual pattern from.');
  const grid = regularize(history.ts, history.values, { step: stepMs, agg: 'mean' });
  const start = window ? Math.floor(window.from / stepMs) * stepMs : grid.start;
  const cells = window ? Math.ceil(window.to / stepMs) - start / stepMs : grid.values.length;
  const values = new Float64Array(Math.max(cells, 0)).fill(NaN);
  const offset = Math.round((grid.start - start) / stepMs);
  for (let i = 0; i < grid.values.length; i++) if (i + offset >= 0 && i + offset < values.length) values[i + offset] = grid.values[i];
  const n = values.length;
  if (periodSteps < 2 || n < 3 * periodSteps) {
    return none('too-little-history', `The history spans ${n} steps; three full cycles (${3 * periodSteps} steps) are needed to learn the usual pattern.`);
  }
  let lead = 0;
  while (lead < n && Number.isNaN(values[lead])) lead++;
  if (lead >= periodSteps) {
    // the channel's readings begin inside the window (a new channel, or one back after a long outage): too short, not holey
    return none(
      'too-little-history',
      `The history holds readings for only the last ${n - lead} of its ${n} steps; at least ${n - periodSteps + 1} are needed to learn the usual pattern.`,
    );
  }
  const filled = fillForFit(values, periodSteps);
  if (!filled) {
    return none('too-many-gaps', 'Too much of the history is missing (more than a fifth of it, or a whole cycle at one end) to learn the usual pattern.');
  }
  const heldOut = usualAfter(values, n - periodSteps, periodSteps);
  const errors: number[] = [];
  for (let i = n - periodSteps; i < n; i++) if (!filled[i]) errors.push(values[i] - heldOut(i));
  if (errors.length < MIN_SPREAD_CELLS) {
    return none(
      'too-many-gaps',
      `The last cycle of the history holds only ${errors.length} steps with readings; at least ${MIN_SPREAD_CELLS} are needed to measure the usual spread.`,
    );
  }
  const { center, scale } = robustScale(errors);
  const usualOf = usualAfter(values, n, periodSteps);
  const usual = Float64Array.from(readings, (r) => usualOf(Math.floor((r.ts - start) / stepMs)) + center);
  const scores = Float64Array.from(readings, (r, i) => {
    const deviation = r.value - usual[i];
    if (scale === 0) return deviation === 0 ? 0 : Math.sign(deviation) * Infinity;
    return deviation / scale;
  });
  return { scores, usual, notJudged: null };
}

/** Where in its cycle a reading lies, in words: "for this time of day" (24 h), "of the week" (168 h), else "at this point of its 12-hour cycle". */
export function cyclePlaceWords(periodH: number): string {
  if (periodH === 24) return 'for this time of day';
  if (periodH === 168) return 'for this time of the week';
  return `at this point of its ${formatValue(periodH)}-hour cycle`;
}

/**
 * Unusual-reading rule: opens at the first reading whose score ({@link unusualScores}) lies
 * beyond `k` robust standard deviations (so the usual afternoon peak, which the seasonal
 * component carries, does not count, and an abnormal one does); resolves at the first later
 * reading within `k`. Without scores (too little history) nothing is judged (the evaluator
 * records why on the rule). Texts give the reading and the usual value at the resolution the
 * readings carry, with the unit, and the distance as a rough multiple of the usual spread:
 * "40.1 °C, about 49 times the usual spread above the usual 16.9 °C for this time of day". Pure.
 *
 * Cost: O(n) in the number of readings once they are scored.
 */
export function evaluateUnusualReading(
  params: UnusualParams,
  scored: ScoredReadings | null,
  memory: RuleMemory,
  readings: readonly RuleReading[],
  unit = '',
): RuleStep {
  let { open } = memory;
  const transitions: RuleTransition[] = [];
  const previous = readings.at(-1) ?? memory.previous;
  if (!scored) return { memory: { ...memory, previous }, transitions };
  const decimals = readingDecimals(readings.map((r) => r.value));
  const place = cyclePlaceWords(params.periodH);
  for (let i = 0; i < readings.length; i++) {
    const r = readings[i];
    const score = scored.scores[i];
    const unusual = Math.abs(score) > params.k;
    const value = withUnit(r.value, unit, decimals);
    const usual = `the usual ${withUnit(scored.usual[i], unit, decimals)} ${place}`;
    if (unusual && !open) {
      open = true;
      const side = score > 0 ? 'above' : 'below';
      const far = Number.isFinite(score)
        ? `about ${roughRatio(Math.abs(score))} times the usual spread ${side} ${usual}`
        : `${side} ${usual}, where the readings used not to vary at all`;
      transitions.push({ kind: 'open', ts: r.ts, value: r.value, detail: `${value}, ${far} (limit ${formatValue(params.k)} times the spread)` });
    } else if (!unusual && open) {
      open = false;
      transitions.push({ kind: 'resolve', ts: r.ts, value: r.value, detail: `${value} fits the usual pattern again (${usual})` });
    }
  }
  return { memory: { pendingSince: null, previous, open }, transitions };
}
