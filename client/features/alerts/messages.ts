/**
 * Words the alerts screens write themselves (rule form refusals, notices, confirmations, empty
 * states). This file is the one place to review how the alerts feature speaks to people; field
 * labels the server shares live in `@shared/contract/words/alerts.ts`.
 */

/** The rule form was sent before anything to watch was chosen (asked first, before any other check). */
export const CHOOSE_CHANNEL_TO_WATCH = 'Choose the channel to watch';

/** Notice after a new rule is saved. */
export function ruleMade(ruleName: string, watched: string): string {
  return `The rule “${ruleName}” watches ${watched} now; you will be mailed when it fires.`;
}

/** Question before a rule is deleted. */
export function deleteRuleQuestion(ruleName: string): string {
  return `Delete the rule “${ruleName}”? Its past alerts stay.`;
}

const count = (n: number, one: string) => `${n} ${n === 1 ? one : `${one}s`}`;

/** A duration in words ("5 minutes", "1 hour 30 minutes", "2 days"), for rule settings kept in seconds. */
export function durationWords(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s === 0) return '0 seconds';
  const parts: Array<[number, string]> = [
    [Math.floor(s / 86_400), 'day'],
    [Math.floor((s % 86_400) / 3600), 'hour'],
    [Math.floor((s % 3600) / 60), 'minute'],
    [s % 60, 'second'],
  ];
  return parts
    .filter(([n]) => n > 0)
    .map(([n, unit]) => count(n, unit))
    .join(' ');
}

/** A rule that judges its channel's readings: "Watching — last judged …". */
export const RULE_WATCHING = 'Watching';
/** A rule that cannot judge its channel: "Not watching since … — <reason>". */
export const RULE_NOT_WATCHING = 'Not watching';
/** Said in place of a time when a watching rule has judged nothing yet. */
export const RULE_NOTHING_JUDGED = 'no reading judged yet';
/** What a blind rule means for the lab, beneath its reason. */
export const RULE_BLIND_MEANS = 'Until it watches again, this rule raises no alert; its subscribers are mailed once it has been blind for its reminder delay.';
