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
