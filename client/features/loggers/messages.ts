/**
 * Words the logger screens write themselves (the test-reading check, confirmations, notices).
 * This file is the one place to review how the loggers feature speaks to people; field labels
 * the server shares live in `@shared/contract/words/loggers.ts`.
 */

/** Appended to the label of a box that takes seconds ("Expected time between readings in seconds"). */
export const IN_SECONDS = ' in seconds';

/** The test-reading value is empty or not a number (said under the Value field). */
export const TEST_VALUE_NOT_A_NUMBER = 'Enter the value as a number, e.g. 21.5';

/** The check says a logger's reading like this one would be quarantined, and why (the server's words). */
export function wouldGoToQuarantine(channelKey: string, reason: string): string {
  return `A logger’s reading of “${channelKey}” would go to quarantine: ${reason.replace(/[.\s]+$/, '')}. Nothing was kept.`;
}

/** Question before a logger is retired. */
export const retireLoggerQuestion = (name: string): string => `Retire ${name}? Its readings are kept, but its keys stop working and it accepts no new data.`;

export const LOGGER_NOTICES = {
  noSuchLogger: 'There is no such logger in this lab.',
  retired: 'This logger is retired: its readings are kept, and it accepts no new data.',
} as const;
