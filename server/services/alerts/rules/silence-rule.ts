import { durationWords, type RuleTransition } from './rule-step.ts';

/** What a silence check needs to know. */
export interface SilenceInput {
  /** Newest reading time of the watched channel (or of any channel of the watched logger), or null. */
  lastReadingTs: number | null;
  /** When the rule started watching (counts as the last sign of life only when nothing ever reported). */
  watchingSince: number;
  /** The expected reporting interval in seconds. */
  expectedIntervalS: number;
  /** How many expected intervals of silence open the alert (> 1 leaves room for jitter). */
  factor: number;
  open: boolean;
  now: number;
}

/**
 * Silence rule: opens once nothing has been heard for longer than `factor` × the expected
 * interval (at the moment that limit passed; a target already silent when the rule is made
 * opens at the first check), resolves when a reading newer than the
 * silence arrives. Pure: the caller passes the clock in `now`.
 *
 * Cost: O(1).
 */
export function evaluateSilence(input: SilenceInput): { open: boolean; transition: RuleTransition | null } {
  const limitMs = input.factor * input.expectedIntervalS * 1000;
  const lastSign = input.lastReadingTs ?? input.watchingSince;
  const silentFor = input.now - lastSign;
  if (!input.open && silentFor > limitMs) {
    const heard = input.lastReadingTs === null ? 'no reading ever arrived' : `no reading for ${durationWords(silentFor)}`;
    return { open: true, transition: { kind: 'open', ts: lastSign + limitMs, value: null, detail: `${heard} (limit ${durationWords(limitMs)})` } };
  }
  if (input.open && silentFor <= limitMs && input.lastReadingTs !== null) {
    return { open: false, transition: { kind: 'resolve', ts: input.lastReadingTs, value: null, detail: 'readings arrive again' } };
  }
  return { open: input.open, transition: null };
}
