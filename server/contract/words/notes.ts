/**
 * Words of notes on time ranges and of the lab's note kinds: field labels and the reasons their
 * checks give. Shared by the contract, the notes service and the client.
 */

/** Fields of a note and of a note kind. */
export const NOTE_LABELS = {
  channelId: 'Channel',
  loggerId: 'Logger',
  kindId: 'Kind of note',
  text: 'Note',
  start: 'Start',
  end: 'End',
  excludeFromAnalysis: 'Leave this span out of analyses',
  name: 'Name of the kind',
  retired: 'Retired',
  noteId: 'Note',
} as const;

/** Reasons the notes area's own checks give. */
export const NOTE_REASONS = {
  textEmpty: 'must not be empty (say what happened)',
  endAfterStart: 'must be after the start (a note covers at least one millisecond)',
  channelOrLogger: 'choose either one channel or a whole logger, not both',
  toAfterFrom: 'must be after the start of the range',
} as const;
