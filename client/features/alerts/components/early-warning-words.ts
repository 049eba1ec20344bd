/**
 * Words of the early warning on a bounds rule (issue #22): the opt-in on the rule form, its
 * refusals in the form's own units, and how an expected-stage alert is named beside a crossed
 * one. Our own wording; one place to review it.
 */

/** The opt-in box on a bounds rule. */
export const WARN_BEFORE_LIMIT = 'Warn before the limit is reached';
/** What the opt-in does, beneath it. */
export const WARN_BEFORE_LIMIT_HINT =
  'From the channel’s recent course (its daily cycle taken off, a small time-series model fitted), Lagbook estimates the chance that the readings pass a limit within the look-ahead and warns when it is high. The limit alert still opens as usual when a limit is really passed.';
export const LOOK_AHEAD_LABEL = 'Look ahead (minutes)';
export const WARN_AT_CHANCE_LABEL = 'Warn at a chance of at least (%)';

/** Refusal of the look-ahead box (the contract allows 5…1,440 whole minutes). */
export const LOOK_AHEAD_REASON = 'must be a whole number of minutes from 5 to 1,440 (one day)';
/** Refusal of the chance box, in the percent the form shows (the contract keeps 0.5…0.99). */
export const CHANCE_PERCENT_REASON = 'must be a percentage from 50 to 99';

/** An alert's stage as a word people read (never colour alone). */
export const STAGE_WORDS = { crossed: 'Crossed', expected: 'Expected to cross' } as const;

/** The caution beside an early warning: an aid to attention, not a safety system. */
export const EARLY_WARNING_CAUTION =
  'An early warning is a statistical estimate from past readings, not a safety system: a sudden fault can pass the limit with no warning at all. Keep your lab’s own alarms and checks for freezers, cold rooms and incubators, and follow your lab’s safety rules and local regulations.';

/** "p ≈ 0.83" for a chance. */
export function chanceWords(p: number): string {
  return `p ≈ ${Math.min(0.99, Math.max(0.01, p)).toFixed(2)}`;
}

/**
 * A band's ends as people read them: as many decimals as the band's width warrants (a band
 * 6.93–8.41 reads "6.9–8.4"), with the unit ("6.9–8.4 °C"). Common practice: quote an interval
 * no more precisely than its own width.
 */
export function bandWords(lower: number, upper: number, unit: string): string {
  const width = upper - lower;
  const decimals = width > 0 && Number.isFinite(width) ? Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(width)))) : 2;
  return `${lower.toFixed(decimals)}–${upper.toFixed(decimals)}${unit.trim() ? ` ${unit.trim()}` : ''}`;
}

/** The look-ahead in words ("40 minutes", "2 hours", "1 hour 30 minutes"). */
export function lookAheadWords(minutes: number): string {
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  const part = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;
  return [h > 0 ? part(h, 'hour') : '', m > 0 || h === 0 ? part(m, 'minute') : ''].filter(Boolean).join(' ');
}
