import type { ResolvedParameters } from '@shared/contract/diagnostics.ts';
import {
  AGGREGATE_WORDS,
  countWords,
  DECOMPOSITION_WORDS,
  durationWords,
  RESOLVED_PARAMETER_LABELS,
  stepAdjective,
} from '@shared/contract/words/diagnostics.ts';
import { formatInstant, isUtcZone } from '../../../components/clock/format.ts';

/** One line of the method section: the plain label, the value in words with its unit, and the keys it shows. */
export interface MethodRow {
  label: string;
  value: string;
  keys: Array<keyof ResolvedParameters>;
}

/** Parameters shown in a section of their own rather than as a row (the STL settings list). */
export const SHOWN_APART: ReadonlyArray<keyof ResolvedParameters> = ['stl'];

/** "144 steps (1 day)": a count of steps with the time it spans. */
function stepsWords(steps: number, stepS: number): string {
  return `${countWords(steps)} ${steps === 1 ? 'step' : 'steps'} (${durationWords(steps * stepS)})`;
}

const TIMES = ['', 'once', 'twice'];

/** Each parameter's value in words; a Record over every key, so a new parameter without words is a compile error. */
const VALUE_WORDS: { [K in keyof ResolvedParameters]: (r: ResolvedParameters, timezone: string) => string } = {
  from: (r, tz) => `${formatInstant(r.from, tz)} – ${formatInstant(r.to, tz)}${isUtcZone(tz) ? '' : ` (${tz.replaceAll('_', ' ')})`}`,
  to: () => '',
  stepS: (r) => durationWords(r.stepS),
  agg: (r) => `the ${AGGREGATE_WORDS[r.agg]} of the readings in each step`,
  source: (r) => (r.source.kind === 'readings' ? 'the readings themselves' : `stored ${stepAdjective(r.source.resolutionS)} summaries of the readings`),
  difference: (r) =>
    r.difference === 0
      ? 'none'
      : `${TIMES[r.difference] ?? `${r.difference} times`} (the change from one step to the next${r.difference === 2 ? ', taken twice' : ''})`,
  seasonalDifference: (r) =>
    r.seasonalDifference === 0
      ? 'none'
      : `${TIMES[r.seasonalDifference] ?? `${r.seasonalDifference} times`}${r.period === null ? '' : `, at ${stepsWords(r.period, r.stepS)}`}`,
  period: (r) => (r.period === null ? 'none' : stepsWords(r.period, r.stepS)),
  periodSource: (r) => ({ manual: 'set by hand', detected: 'found in the readings', none: 'no cycle used' })[r.periodSource],
  maxLag: (r) => stepsWords(r.maxLag, r.stepS),
  alpha: (r) => `${r.alpha} (bands and tests at ${Number(((1 - r.alpha) * 100).toFixed(2))} % confidence)`,
  decomposition: (r) => DECOMPOSITION_WORDS[r.decomposition],
  stl: () => '',
  outlierRule: (r) => r.outlierRule ?? 'none (no decomposition)',
  ljungBoxLags: (r) => (r.ljungBoxLags.length ? r.ljungBoxLags.join(', ') : 'none'),
  ccfMaxLag: (r) => (r.ccfMaxLag === null ? 'no second channel chosen' : stepsWords(r.ccfMaxLag, r.stepS)),
  modelCells: (r) => (r.modelCells === null ? 'no model fitted' : `the last ${countWords(r.modelCells)} steps`),
  trendLag: (r) => (r.trendLag === null ? 'no trend fitted' : `${countWords(r.trendLag)} ${r.trendLag === 1 ? 'step' : 'steps'} (Newey–West)`),
};

/**
 * The resolved parameters of a diagnostics run as rows of plain label and value with units
 * ("Step: 10 minutes", "Seasonal difference: once, at 144 steps (1 day)"), labels from the
 * diagnostics catalogue and times on the clock of `timezone`. The range takes `from` and `to`
 * in one row; the STL settings have their own list (SHOWN_APART). Keys the client does not know
 * (a newer server) are left out rather than shown raw.
 */
export function methodRows(r: ResolvedParameters, timezone: string): MethodRow[] {
  const rows: MethodRow[] = [];
  for (const key of Object.keys(r) as Array<keyof ResolvedParameters>) {
    if (key === 'to' || SHOWN_APART.includes(key) || !(key in VALUE_WORDS)) continue;
    rows.push({ label: RESOLVED_PARAMETER_LABELS[key], value: VALUE_WORDS[key](r, timezone), keys: key === 'from' ? ['from', 'to'] : [key] });
  }
  return rows;
}
