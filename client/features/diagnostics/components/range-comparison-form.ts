import { toZonedInput } from '../../../components/clock/format.ts';
import { readDateTime } from '../../../components/date-time-input-read.ts';
import type { ComparisonParams } from '@shared/contract/diagnostics.ts';
import type { DiagnosticsParams } from '@shared/contract/diagnostics.ts';

/** The comparison form's fields as typed (strings until submitted); times are wall-clock in the logger's zone. */
export interface ComparisonDraft {
  aFrom: string;
  aTo: string;
  bFrom: string;
  bTo: string;
  /** '' for this channel, else the other channel's id. */
  other: string;
  step: string;
  agg: DiagnosticsParams['agg'];
  alpha: string;
}

/** The default ranges: the first and second half of `range`, as the form shows them in `timezone`. */
export function halvesDraft(range: { from: number; to: number }, timezone: string): Pick<ComparisonDraft, 'aFrom' | 'aTo' | 'bFrom' | 'bTo'> {
  const mid = range.from + Math.floor((range.to - range.from) / 2);
  return {
    aFrom: toZonedInput(range.from, timezone),
    aTo: toZonedInput(mid, timezone),
    bFrom: toZonedInput(mid, timezone),
    bTo: toZonedInput(range.to, timezone),
  };
}

function readRange(name: string, from: string, to: string, timezone: string): { from: number; to: number } | string {
  const f = readDateTime(from, timezone);
  if (!f.ok) return `${name} from: ${f.problem}`;
  const t = readDateTime(to, timezone);
  if (!t.ok) return `${name} to: ${t.problem}`;
  if (f.ms >= t.ms) return `${name}: “to” must be after “from”`;
  return { from: f.ms, to: t.ms };
}

/**
 * Turns the draft into request parameters, or a `field: reason` message, so an obvious mistake is
 * caught before a request (the server checks again). Empty step, the mean aggregate and α = 0.05
 * are still sent as typed, so the answer states exactly what was asked.
 */
export function comparisonParamsFromDraft(d: ComparisonDraft, timezone: string): ComparisonParams | string {
  const a = readRange('Range A', d.aFrom, d.aTo, timezone);
  if (typeof a === 'string') return a;
  const b = readRange('Range B', d.bFrom, d.bTo, timezone);
  if (typeof b === 'string') return b;
  const stepText = d.step.trim();
  const step = stepText === '' ? undefined : /^\d+$/.test(stepText) ? Number(stepText) : NaN;
  if (step !== undefined && !(step >= 1 && step <= 2_678_400)) return 'Resampling step: a whole number of seconds from 1 to 2678400';
  const alpha = Number(d.alpha);
  if (d.alpha.trim() === '' || !(alpha > 0 && alpha <= 0.5)) return 'α: a number above 0 and at most 0.5';
  return {
    aFrom: a.from,
    aTo: a.to,
    bFrom: b.from,
    bTo: b.to,
    ...(step !== undefined ? { step } : {}),
    agg: d.agg,
    ...(d.other !== '' ? { otherChannel: Number(d.other) } : {}),
    alpha,
  };
}
