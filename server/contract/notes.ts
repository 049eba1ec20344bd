import { z } from 'zod';
import { idParams, type IsoTime } from './common.ts';
import { rangeFields, timeParam, wholeNumber, type TimeRange } from './channels.ts';
import { NOTE_REASONS } from './words/notes.ts';

/**
 * Notes on time ranges: why a channel's data (or every channel of a logger's) looks as it does
 * between two instants — a cleaning, a calibration, a swapped sensor, a door left open — with
 * a kind from the lab's own list and free text. A note marked `excludeFromAnalysis` takes its
 * span out of diagnostics, range comparisons and the unusual-reading alert fits. Times in an
 * input are epoch milliseconds or ISO 8601 with a zone; in an answer epoch milliseconds.
 */

/** Lagbook's starting list of note kinds, which each lab may rename, extend and retire. */
export const DEFAULT_NOTE_KINDS = ['maintenance', 'calibration', 'sensor change', 'disturbance', 'other'] as const;

/** The longest note text, in characters. */
export const MAX_NOTE_TEXT = 2000;
/** The most notes one list answer holds (the newest first beyond it; `truncated` says so). */
export const MAX_NOTES_LISTED = 2000;

/** A time in a body: epoch milliseconds (number or text) or ISO 8601 with a zone. */
const bodyTime = z.preprocess((v) => (typeof v === 'number' ? String(v) : v), timeParam);
const id = wholeNumber(1, Number.MAX_SAFE_INTEGER);
const noteText = z.string({ error: 'must be text' }).trim().min(1, NOTE_REASONS.textEmpty).max(MAX_NOTE_TEXT, `must be at most ${MAX_NOTE_TEXT} characters`);
const exclude = z.boolean({ error: 'must be true or false' });
const endAfterStart = { path: ['end'], message: NOTE_REASONS.endAfterStart };

/** `POST …/notes`: a note on one channel (`channelId`) or on every channel of a logger (`loggerId`). */
export const createNoteSchema = z
  .object({
    channelId: id.optional(),
    loggerId: id.optional(),
    kindId: id,
    text: noteText,
    start: bodyTime,
    end: bodyTime,
    excludeFromAnalysis: exclude.default(false),
  })
  .strict()
  .refine((n) => (n.channelId === undefined) !== (n.loggerId === undefined), {
    path: ['channelId'],
    message: NOTE_REASONS.channelOrLogger,
  })
  .refine((n) => n.end > n.start, endAfterStart);
export type CreateNoteInput = z.infer<typeof createNoteSchema>;

/** `PATCH …/notes/:noteId`: kind, text, span or the leave-out flag (what it is on stays; make a new note). */
export const updateNoteSchema = z
  .object({ kindId: id.optional(), text: noteText.optional(), start: bodyTime.optional(), end: bodyTime.optional(), excludeFromAnalysis: exclude.optional() })
  .strict()
  .refine((n) => n.start === undefined || n.end === undefined || n.end > n.start, endAfterStart);
export type UpdateNoteInput = z.infer<typeof updateNoteSchema>;

/** `?from&to` of a notes list or export: both optional (no bound on that side when left out). */
export const notesQuery = z
  .object(rangeFields)
  .refine((q) => q.from === undefined || q.to === undefined || q.to > q.from, { path: ['to'], message: NOTE_REASONS.toAfterFrom });
export type NotesQuery = z.infer<typeof notesQuery>;

/** `/notes/:noteId`. */
export const noteParams = idParams('noteId');
/** `/note-kinds/:kindId`. */
export const noteKindParams = idParams('kindId');
/** `/loggers/:loggerId/notes`. */
export const loggerNotesParams = idParams('loggerId');

const kindName = z.string({ error: 'must be text' }).trim().min(1, 'must not be empty').max(40, 'must be at most 40 characters');

/** `POST …/note-kinds`: a new kind. */
export const createNoteKindSchema = z.object({ name: kindName }).strict();
export type CreateNoteKindInput = z.infer<typeof createNoteKindSchema>;

/** `PATCH …/note-kinds/:kindId`: rename, retire (`retired: true`) or bring back. */
export const updateNoteKindSchema = z.object({ name: kindName.optional(), retired: z.boolean({ error: 'must be true or false' }).optional() }).strict();
export type UpdateNoteKindInput = z.infer<typeof updateNoteKindSchema>;

/** One kind of a lab's list; a retired kind stays on old notes but is not offered for new ones. */
export interface NoteKind {
  id: number;
  name: string;
  retired: boolean;
  /** How many notes of the lab have this kind. */
  notes: number;
}

/** A person named on a note (null once the account is gone). */
export interface NotePerson {
  id: number;
  name: string;
}

/** One note as answers carry it. */
export interface Note extends TimeRange {
  id: number;
  loggerId: number;
  loggerName: string;
  /** Null: the note is on every channel of the logger. */
  channelId: number | null;
  channelLabel: string | null;
  kind: { id: number; name: string; retired: boolean };
  text: string;
  excludeFromAnalysis: boolean;
  createdBy: NotePerson | null;
  createdAt: IsoTime;
  updatedBy: NotePerson | null;
  updatedAt: IsoTime;
}

/** A list of notes, oldest start first; `truncated` when more than MAX_NOTES_LISTED matched. */
export interface NotesAnswer {
  notes: Note[];
  truncated: boolean;
}

/** One note. */
export interface NoteAnswer {
  note: Note;
}

/** The lab's kinds, in list order. */
export interface NoteKindsAnswer {
  kinds: NoteKind[];
}

/** One kind. */
export interface NoteKindAnswer {
  kind: NoteKind;
}

/** A note a diagnostics run or comparison left out of the analysis, and what it took away. */
export interface AppliedNote extends TimeRange {
  id: number;
  kind: string;
  text: string;
  /** Null: the note is on the whole logger. */
  channelId: number | null;
  /** The channel whose cells were left out (the analysed channel, or the CCF partner). */
  removedFrom: number;
  /** Grid cells of the analysed range under the note that held readings, now missing (a cell under two notes counts for each). */
  cellsRemoved: number;
}
