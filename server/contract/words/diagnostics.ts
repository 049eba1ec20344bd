import type { ResolvedParameters } from '../diagnostics.ts';

/**
 * The diagnostics catalogue: every sentence and label a person sees about channel diagnostics,
 * the before/after comparison, the cross-correlation and the decomposition, in one place so the
 * wording is reviewed together. Shared by the server (routes, services, the query schemas) and
 * the client (`@shared/contract/words/diagnostics.ts`). Written for a lab scientist or technician:
 * no function names, field keys or row ids; every number with its unit.
 */

const UNITS: Array<[seconds: number, one: string, many: string]> = [
  [86_400, 'day', 'days'],
  [3_600, 'hour', 'hours'],
  [60, 'minute', 'minutes'],
  [1, 'second', 'seconds'],
];

/** A whole number with thousands separators ("2,016"), the same on every machine. */
export function countWords(n: number): string {
  return Math.round(n).toLocaleString('en-US');
}

/**
 * A duration in seconds in words, in the largest unit that holds it whole ("10 minutes",
 * "1 day", "90 seconds"), so steps and cycles read as people say them.
 */
export function durationWords(seconds: number): string {
  for (const [size, one, many] of UNITS) {
    if (seconds >= size && seconds % size === 0) {
      const n = seconds / size;
      return `${countWords(n)} ${n === 1 ? one : many}`;
    }
  }
  const s = Number(seconds.toPrecision(3));
  return `${s} ${s === 1 ? 'second' : 'seconds'}`;
}

/**
 * A step length as an adjective ("hourly", "daily", "10-minute", "30-second"), for phrases such
 * as "169 hourly steps".
 */
export function stepAdjective(seconds: number): string {
  if (seconds === 3_600) return 'hourly';
  if (seconds === 86_400) return 'daily';
  if (seconds === 604_800) return 'weekly';
  for (const [size, one] of UNITS) {
    if (seconds >= size && seconds % size === 0) return `${countWords(seconds / size)}-${one}`;
  }
  return `${Number(seconds.toPrecision(3))}-second`;
}

/** "1 value" / "8 values": a count with its noun, singular when it is one. */
function counted(n: number, one: string, many: string): string {
  return `${countWords(n)} ${n === 1 ? one : many}`;
}

/**
 * Plain labels of the diagnostics and comparison query fields (the keys of `diagnosticsQuery`
 * and `comparisonQuery` in `../diagnostics.ts`): what a validation answer names instead of the key.
 */
export const DIAGNOSTICS_FIELD_LABELS = {
  from: 'Start of the range',
  to: 'End of the range',
  step: 'Step',
  agg: 'Summary of each step',
  difference: 'Differencing',
  seasonalDifference: 'Seasonal difference',
  maxLag: 'Longest lag',
  period: 'Cycle length',
  decomposition: 'Decomposition',
  alpha: 'Significance level',
  ccfWith: 'Second channel',
  ccfMaxLag: 'Longest lag between the channels',
  aFrom: 'Start of range A',
  aTo: 'End of range A',
  bFrom: 'Start of range B',
  bTo: 'End of range B',
  otherChannel: 'Channel for range B',
} as const;

/** A query field of the diagnostics area. */
export type DiagnosticsField = keyof typeof DIAGNOSTICS_FIELD_LABELS;

/** The reasons the diagnostics query schemas give (zod messages), in plain words. */
export const DIAGNOSTICS_REASONS = {
  aggregate: 'must be mean, median, last, lowest or highest',
  decomposition: 'must be STL, robust STL, classical or none',
  period: 'must be “auto”, “none” or a whole number of steps from 2 to 100,000',
  seasonalNeedsPeriod: 'needs a cycle length (found automatically or a number of steps), not “none”',
  ccfLagNeedsPartner: 'only applies when a second channel is chosen',
  timeRequired: 'is required: a date and time with its zone, such as 2026-11-20T00:00+01:00',
  rangeOrder: 'must be after the start of its range',
  rangeLength: 'the range must be at most 20 years',
} as const;

/**
 * Plain labels of the resolved parameters a diagnostics report prints in its method section,
 * one per key of `ResolvedParameters` (the type makes a new key without a label a compile error;
 * the method block's test fails if one is shown raw).
 */
export const RESOLVED_PARAMETER_LABELS: Record<keyof ResolvedParameters, string> = {
  from: 'Range',
  to: 'Range ends',
  stepS: 'Step',
  agg: 'Summary of each step',
  source: 'Values read from',
  difference: 'Differencing',
  seasonalDifference: 'Seasonal difference',
  period: 'Cycle length',
  periodSource: 'Cycle length chosen by',
  maxLag: 'Longest lag shown',
  alpha: 'Significance level',
  decomposition: 'Decomposition',
  stl: 'STL settings',
  outlierRule: 'Outlier rule',
  ljungBoxLags: 'Ljung–Box test lags',
  ccfMaxLag: 'Longest lag between the channels',
  modelCells: 'Steps the process model is fitted to',
  trendLag: 'Trend standard error: lags allowed for',
};

/** Plain names of the step summaries (the `agg` choices). */
export const AGGREGATE_WORDS = { mean: 'mean', median: 'median', last: 'last reading', min: 'lowest', max: 'highest' } as const;

/** Plain names of the decomposition choices. */
export const DECOMPOSITION_WORDS = { stl: 'STL', 'stl-robust': 'robust STL', classical: 'classical (moving averages)', none: 'none' } as const;

/** What the analysis was doing with the values when a refusal names them. */
export interface RefusalContext {
  /** The grid step in seconds. */
  stepS: number;
  /** Ordinary differences taken (0–2). */
  difference: number;
  /** Seasonal differences taken (0–1). */
  seasonalDifference: number;
}

/** The engine's typed refusal (mirrors `AnalysisInputDetail` in the engine, which the contract may not import). */
export interface RefusalDetail {
  reason: string;
  need?: number;
  got?: number;
  period?: number;
  range?: 'a' | 'b';
}

/** "the daily cycle" (or "the 12-hour cycle") for a period of `period` steps of `stepS` seconds. */
function cycleWords(period: number, stepS: number): string {
  return `the ${stepAdjective(period * stepS)} cycle`;
}

/** What differencing removed, in words, e.g. "removing the daily cycle and the change from step to step". */
function removedWords(detail: RefusalDetail, ctx: RefusalContext): string {
  const parts: string[] = [];
  if (ctx.seasonalDifference > 0) parts.push(detail.period ? `removing ${cycleWords(detail.period, ctx.stepS)}` : 'removing the cycle');
  if (ctx.difference === 1) parts.push('taking the change from step to step');
  if (ctx.difference === 2) parts.push('taking the change from step to step twice');
  return parts.join(' and ');
}

const LONGER = 'Choose a longer range or a shorter step.';

/**
 * The sentence a person reads when the analysis refuses the chosen readings or settings: how
 * many values the range gave, how many are needed and why, and what to do. Built from the
 * engine's typed reason and counts, never from its developer message.
 */
export function analysisRefusal(detail: RefusalDetail, ctx: RefusalContext): string {
  const need = detail.need ?? 0;
  const got = detail.got ?? 0;
  const steps = `${stepAdjective(ctx.stepS)} steps`;
  switch (detail.reason) {
    case 'too-few-cells':
      return `The chosen range has readings in only ${counted(got, `${stepAdjective(ctx.stepS)} step`, steps)}; the analysis needs readings in at least ${countWords(need)} to say anything about the channel. ${LONGER}`;
    case 'too-few-after-differencing':
      return `After ${removedWords(detail, ctx)}, ${counted(got, 'value is', 'values are')} left and at least ${countWords(need)} are needed for the correlations and tests to mean anything. ${LONGER}`;
    case 'too-few-values':
      return `The chosen range gave ${counted(got, 'value', 'values')} in ${steps}, and this analysis needs at least ${countWords(need)} to give dependable figures. ${LONGER}`;
    case 'too-few-pairs':
      return `The two channels both have a value at only ${counted(got, 'step', 'steps')} of the chosen range; comparing them needs at least ${countWords(need)}. Choose a range in which both were recording, or a longer step.`;
    case 'too-few-periods': {
      const cycle = detail.period ? cycleWords(detail.period, ctx.stepS) : 'the cycle';
      return `Splitting off ${cycle} needs at least two whole cycles (${counted(need, 'value', 'values')}), and the chosen range gave ${countWords(got)}. Choose a longer range, a shorter cycle length, or no decomposition.`;
    }
    case 'too-few-in-range':
      return `Range ${(detail.range ?? 'a').toUpperCase()} gave ${counted(got, 'value', 'values')} in ${steps}; comparing means needs at least ${countWords(need)} in each range. ${LONGER}`;
    case 'too-few-independent':
      return `The readings of range ${(detail.range ?? 'a').toUpperCase()} follow each other so closely that they count as only ${Number(got.toPrecision(2))} independent readings, and an interval for the mean needs at least ${countWords(need)}. Choose a longer range.`;
    case 'period-too-long':
      return `A cycle length of ${counted(got, 'step', 'steps')} cannot be seen twice in the chosen range; it allows at most ${counted(need, 'step', 'steps')}. Choose a shorter cycle length or a longer range.`;
    case 'no-period':
      return 'Seasonal differencing needs a cycle length, and none was entered or found in these readings. Enter the cycle length in steps, or switch seasonal differencing off.';
    case 'constant':
      return 'The readings do not change in the chosen range, so there is no variation to analyse. Choose a range in which the readings vary.';
    case 'straight-line':
      return 'The readings lie exactly on a straight line in the chosen range, so the trend has no uncertainty to estimate. Choose another range.';
    case 'too-many-cells':
      return `The chosen step divides the range into ${countWords(got)} steps, more than one run can hold (${countWords(need)}). Choose a longer step or a shorter range.`;
    case 'unstable-model':
      return 'No stable model could be fitted to the readings of the chosen range: they keep drifting without settling. Choose a longer or steadier range, or take the change from step to step.';
    default:
      return 'The analysis could not run on these readings with these settings. Check the settings or choose another range.';
  }
}

/** The other sentences of the diagnostics routes, in one place. */
export const DIAGNOSTICS_MESSAGES = {
  noReadings: 'This channel has no readings in the chosen range.',
  noReadingsOutsideNotes: 'This channel has no readings in the chosen range outside the notes marked “leave out of analysis”.',
  partnerNoReadings: 'The second channel has no readings in the chosen range.',
  /** Range A or B of a comparison holds no readings of its channel. */
  rangeNoReadings: (range: 'a' | 'b', channel: string, besideNotes: boolean): string =>
    `${channel} has no readings in range ${range.toUpperCase()}${besideNotes ? ' outside the notes marked “leave out of analysis”' : ''}.`,
  /** The range splits into more steps than one run may hold. */
  tooManySteps: (steps: number, stepS: number, most: number): string =>
    `the chosen range holds ${countWords(steps)} steps of ${durationWords(stepS)}, more than the ${countWords(most)} one run may take: choose a longer step or a shorter range`,
} as const;
