import type { Response } from 'express';
import { csvLine } from '../csv-field.ts';
import { channelParams } from '../../contract/channels.ts';
import {
  createNoteKindSchema,
  createNoteSchema,
  loggerNotesParams,
  noteKindParams,
  noteParams,
  notesQuery,
  updateNoteKindSchema,
  updateNoteSchema,
  type Note,
  type NoteAnswer,
  type NoteKindAnswer,
  type NoteKindsAnswer,
  type NotesAnswer,
} from '../../contract/notes.ts';
import type { NotesService } from '../../services/notes/notes.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

const CSV_HEADER = [
  'note_id',
  'logger',
  'channel',
  'kind',
  'text',
  'from_utc',
  'to_utc',
  'from_epoch_ms',
  'to_epoch_ms',
  'leave_out_of_analysis',
  'created_by',
  'updated_by',
  'updated_at_utc',
];

/** Sends notes as a CSV download named `<name>.csv` (every field through csvLine's formula guard). */
function sendNotesCsv(res: Response, name: string, notes: Note[]): void {
  res.set('Content-Type', 'text/csv; charset=utf-8');
  res.set('Content-Disposition', `attachment; filename="${name.replace(/[^A-Za-z0-9_.-]+/g, '-')}.csv"`);
  let text = csvLine(CSV_HEADER);
  for (const n of notes) {
    text += csvLine([
      n.id,
      n.loggerName,
      n.channelLabel ?? '(whole logger)',
      n.kind.name,
      n.text,
      new Date(n.from).toISOString(),
      new Date(n.to).toISOString(),
      n.from,
      n.to,
      n.excludeFromAnalysis ? 'yes' : 'no',
      n.createdBy?.name ?? '',
      n.updatedBy?.name ?? '',
      n.updatedAt,
    ]);
  }
  res.end(text);
}

const RANGE_NOTE = '`from`/`to` (epoch ms or ISO 8601 with a zone) keep the notes overlapping that range; either may be left out.';

/**
 * Notes on time ranges and the lab's note kinds. Reading needs `channels.read` (guests and
 * scientists read), writing `loggers.manage` (technicians and admins), the CSV exports
 * `exports.create`. A channel, logger or kind named in a body that is not this lab's (or is
 * retired) answers 400 naming the field; a note, kind, channel or logger in the path that is
 * not this lab's answers 404.
 */
export function noteRoutes(deps: { notes: NotesService }): Route[] {
  const { notes } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/notes',
      auth: { permission: 'channels.read' },
      tag: 'notes',
      summary: `A channel's notes with the whole-logger notes of its logger, earliest first. ${RANGE_NOTE}`,
      params: channelParams,
      query: notesQuery,
      response: { status: 200, description: 'The notes, and whether the list was cut at 2,000 (the newest kept).' },
      handle: async ({ lab, params, query }): Promise<NotesAnswer> => notes.forChannel(lab, params.channelId, query),
    }),
    defineRoute({
      method: 'get',
      path: '/loggers/:loggerId/notes',
      auth: { permission: 'channels.read' },
      tag: 'notes',
      summary: `Every note of a logger: on the whole logger and on each of its channels. ${RANGE_NOTE}`,
      params: loggerNotesParams,
      query: notesQuery,
      response: { status: 200, description: 'The notes, and whether the list was cut at 2,000 (the newest kept).' },
      handle: async ({ lab, params, query }): Promise<NotesAnswer> => notes.forLogger(lab, params.loggerId, query),
    }),
    defineRoute({
      method: 'get',
      path: '/notes',
      auth: { permission: 'channels.read' },
      tag: 'notes',
      summary: `Every note of the lab. ${RANGE_NOTE}`,
      query: notesQuery,
      response: { status: 200, description: 'The notes, and whether the list was cut at 2,000 (the newest kept).' },
      handle: async ({ lab, query }): Promise<NotesAnswer> => notes.forLab(lab, query),
    }),
    defineRoute({
      method: 'post',
      path: '/notes',
      auth: { permission: 'loggers.manage' },
      tag: 'notes',
      summary:
        'Note a time range of one channel (`channelId`) or of every channel of a logger (`loggerId`): a kind, free text, start and end, and whether diagnostics and unusual-reading alerts leave the span out.',
      body: createNoteSchema,
      response: { status: 201, description: 'The new note.' },
      handle: async ({ lab, actor, body }): Promise<NoteAnswer> => ({ note: await notes.create(lab, actor, body) }),
    }),
    defineRoute({
      method: 'patch',
      path: '/notes/:noteId',
      auth: { permission: 'loggers.manage' },
      tag: 'notes',
      summary: "Change a note's kind, text, start, end or leave-out flag.",
      params: noteParams,
      body: updateNoteSchema,
      response: { status: 200, description: 'The changed note.' },
      handle: async ({ lab, actor, params, body }): Promise<NoteAnswer> => ({ note: await notes.update(lab, actor, params.noteId, body) }),
    }),
    defineRoute({
      method: 'delete',
      path: '/notes/:noteId',
      auth: { permission: 'loggers.manage' },
      tag: 'notes',
      summary: 'Delete a note (the audit log keeps what it said).',
      params: noteParams,
      response: { status: 204, description: 'Deleted.' },
      handle: async ({ lab, actor, params }) => notes.remove(lab, actor, params.noteId),
    }),
    defineRoute({
      method: 'get',
      path: '/note-kinds',
      auth: { permission: 'channels.read' },
      tag: 'notes',
      summary: "The lab's note kinds in list order, retired ones too, each with how many notes use it.",
      response: { status: 200, description: 'The kinds.' },
      handle: async ({ lab }): Promise<NoteKindsAnswer> => ({ kinds: await notes.kinds(lab) }),
    }),
    defineRoute({
      method: 'post',
      path: '/note-kinds',
      auth: { permission: 'loggers.manage' },
      tag: 'notes',
      summary: "Add a kind to the end of the lab's list.",
      body: createNoteKindSchema,
      response: { status: 201, description: 'The new kind.' },
      handle: async ({ lab, actor, body }): Promise<NoteKindAnswer> => ({ kind: await notes.createKind(lab, actor, body) }),
    }),
    defineRoute({
      method: 'patch',
      path: '/note-kinds/:kindId',
      auth: { permission: 'loggers.manage' },
      tag: 'notes',
      summary: 'Rename a kind, retire it (`retired: true`: old notes keep it, new notes cannot take it) or bring it back.',
      params: noteKindParams,
      body: updateNoteKindSchema,
      response: { status: 200, description: 'The changed kind.' },
      handle: async ({ lab, actor, params, body }): Promise<NoteKindAnswer> => ({ kind: await notes.updateKind(lab, actor, params.kindId, body) }),
    }),
    defineRoute({
      method: 'get',
      path: '/channels/:channelId/notes.csv',
      auth: { permission: 'exports.create' },
      tag: 'notes',
      summary: `A channel's notes (with its logger's whole-logger notes) as CSV. ${RANGE_NOTE}`,
      params: channelParams,
      query: notesQuery,
      response: { status: 200, description: 'The notes as CSV, one row per note.', mediaType: 'text/csv' },
      stream: true,
      handle: async ({ lab, params, query }, { res }) => {
        const list = await notes.forChannel(lab, params.channelId, query);
        sendNotesCsv(res, `${lab.slug}-channel-${params.channelId}-notes`, list.notes);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/notes.csv',
      auth: { permission: 'exports.create' },
      tag: 'notes',
      summary: `Every note of the lab as CSV, with no cap. ${RANGE_NOTE}`,
      query: notesQuery,
      response: { status: 200, description: 'The notes as CSV, one row per note.', mediaType: 'text/csv' },
      stream: true,
      handle: async ({ lab, query }, { res }) => {
        sendNotesCsv(res, `${lab.slug}-notes`, await notes.allNotesOfLab(lab, query));
      },
    }),
  ];
}
