/**
 * Words the notes screens write themselves (empty lists, limits, confirmations). This file is
 * the one place to review how the notes feature speaks to people; field labels the server
 * shares live in `@shared/contract/words/notes.ts`.
 */

export const NOTES_MESSAGES = {
  noneInRange: 'No notes in this range.',
  newestOnly: 'Only the newest 2,000 notes are listed.',
  deleteQuestion: 'Delete this note?',
  byFormerMember: 'Written by a former member',
} as const;

/** Who changed a note last. */
export const lastChangedBy = (name: string): string => `Last changed by ${name}`;
