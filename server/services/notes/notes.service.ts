import type { Db } from '../../db/create-db.ts';
import { inLab, type LabScope } from '../../db/tenant-scope.ts';
import { notesRepo, type NoteRow, type NotesFilter } from '../../db/notes.repo.ts';
import { noteKindsRepo, type NoteKindRow } from '../../db/note-kinds.repo.ts';
import { channelsRepo } from '../../db/channels.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { NotFoundError } from '../../errors.ts';
import {
  DEFAULT_NOTE_KINDS,
  MAX_NOTES_LISTED,
  type CreateNoteInput,
  type CreateNoteKindInput,
  type Note,
  type NoteKind,
  type NotesQuery,
  type UpdateNoteInput,
  type UpdateNoteKindInput,
} from '../../contract/notes.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import { NOTE_LABELS } from '../../contract/words/notes.ts';
import { fieldRefusal } from '../service-errors.ts';

const NO_NOTE = 'No such note in this lab.';
const NO_KIND = 'No such note kind in this lab.';

/** A note as answers carry it. */
export function presentNote(n: NoteRow): Note {
  return {
    id: n.id,
    loggerId: n.loggerId,
    loggerName: n.loggerName,
    channelId: n.channelId,
    channelLabel: n.channelLabel,
    kind: { id: n.kindId, name: n.kindName, retired: n.kindRetired },
    text: n.text,
    from: n.start,
    to: n.end,
    excludeFromAnalysis: n.excludeFromAnalysis,
    createdBy: n.createdBy,
    createdAt: n.createdAt.toISOString(),
    updatedBy: n.updatedBy,
    updatedAt: n.updatedAt.toISOString(),
  };
}

const presentKind = (k: NoteKindRow): NoteKind => ({ id: k.id, name: k.name, retired: k.retiredAt !== null, notes: k.notes });

/** The notes a diagnostics run leaves out: those marked "leave out of analysis" on a channel (or its logger) overlapping a range. */
export interface ExcludedNote {
  id: number;
  kind: string;
  text: string;
  channelId: number | null;
  start: number;
  end: number;
  updatedAt: number;
}

/**
 * The notes of a channel (and the whole-logger notes of its logger) marked "leave out of
 * analysis" that overlap [from, to), on any scope (a transaction or the pool). Diagnostics,
 * comparisons and the unusual-reading rule read them here, so all three leave out the same spans.
 */
export async function excludedNotes(scope: LabScope, channel: { id: number; loggerId: number }, from: number, to: number): Promise<ExcludedNote[]> {
  const { notes } = await notesRepo(scope).list({ channel, from, to, excludedOnly: true });
  return notes.map((n) => ({ id: n.id, kind: n.kindName, text: n.text, channelId: n.channelId, start: n.start, end: n.end, updatedAt: n.updatedAt.getTime() }));
}

/**
 * Notes on time ranges and the lab's list of note kinds: list (per channel with its logger's
 * whole-logger notes, per logger, per lab), create, change, delete, every change audited.
 * A reference in a body (channel, logger, kind) that is not this lab's, or is retired, is
 * refused as bad input naming the field; a note or kind in the path that is not this lab's
 * answers 404 as if it did not exist.
 */
export function createNotesService(deps: { db: Db; now?: () => number }) {
  const now = deps.now ?? Date.now;
  const scoped = (lab: LabContext) => inLab(deps.db, lab.id);

  async function requireNote(scope: LabScope, noteId: number, forUpdate = false): Promise<NoteRow> {
    const note = await notesRepo(scope).find(noteId, { forUpdate });
    if (!note) throw new NotFoundError(NO_NOTE);
    return note;
  }

  /** A kind a note may take now: this lab's and not retired (`unchanged` lets an old note keep its retired kind). */
  async function usableKind(scope: LabScope, kindId: number, unchanged?: number): Promise<void> {
    await noteKindsRepo(scope).seedIfEmpty(DEFAULT_NOTE_KINDS);
    const kind = await noteKindsRepo(scope).find(kindId);
    if (!kind) throw fieldRefusal('kindId', NOTE_LABELS.kindId, 'is not one of this lab’s kinds of note (choose one of them)');
    if (kind.retiredAt && kindId !== unchanged)
      throw fieldRefusal('kindId', NOTE_LABELS.kindId, `the kind "${kind.name}" is retired (choose another kind, or bring it back first)`);
  }

  async function list(lab: LabContext, filter: NotesFilter): Promise<{ notes: Note[]; truncated: boolean }> {
    const { notes, truncated } = await notesRepo(scoped(lab)).list({ ...filter, limit: filter.limit ?? MAX_NOTES_LISTED });
    return { notes: notes.map(presentNote), truncated };
  }

  /** The lab's kinds (retired ones too), starting with Lagbook's default list the first time. */
  async function kinds(lab: LabContext): Promise<NoteKind[]> {
    const repo = noteKindsRepo(scoped(lab));
    await repo.seedIfEmpty(DEFAULT_NOTE_KINDS);
    return (await repo.list()).map(presentKind);
  }

  const summaryOf = (n: { text: string }) => (n.text.length > 60 ? `${n.text.slice(0, 57)}…` : n.text);

  return {
    /** Notes of a channel and the whole-logger notes of its logger, overlapping the range. */
    async forChannel(lab: LabContext, channelId: number, range: NotesQuery): Promise<{ notes: Note[]; truncated: boolean }> {
      const channel = await channelsRepo(scoped(lab)).find(channelId);
      if (!channel) throw new NotFoundError('No such channel in this lab.');
      return list(lab, { ...range, channel: { id: channel.id, loggerId: channel.loggerId } });
    },

    /** Every note of a logger (whole-logger and per channel), overlapping the range. */
    async forLogger(lab: LabContext, loggerId: number, range: NotesQuery): Promise<{ notes: Note[]; truncated: boolean }> {
      const logger = await loggersRepo(scoped(lab)).find(loggerId);
      if (!logger) throw new NotFoundError('No such logger in this lab.');
      return list(lab, { ...range, loggerId });
    },

    /** Every note of the lab overlapping the range (the newest MAX_NOTES_LISTED when more). */
    async forLab(lab: LabContext, range: NotesQuery): Promise<{ notes: Note[]; truncated: boolean }> {
      return list(lab, range);
    },

    /**
     * All notes of a lab (overlapping `range` when given), with no cap, earliest first: for a
     * whole-lab export (lab deletion offers one) and the lab-wide notes CSV.
     */
    async allNotesOfLab(lab: Pick<LabContext, 'id'>, range: NotesQuery = {}): Promise<Note[]> {
      return (await notesRepo(inLab(deps.db, lab.id)).list(range)).notes.map(presentNote);
    },

    /** Makes a note on a channel or a whole logger of this lab (neither retired). */
    async create(lab: LabContext, actor: Actor, input: CreateNoteInput): Promise<Note> {
      const id = await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        let loggerId: number;
        let where: string;
        if (input.channelId !== undefined) {
          const channel = await channelsRepo(scope).find(input.channelId);
          if (!channel) throw fieldRefusal('channelId', NOTE_LABELS.channelId, 'is not a channel of this lab (pick one of its channels)');
          if (channel.retiredAt)
            throw fieldRefusal('channelId', NOTE_LABELS.channelId, `the channel "${channel.label}" is retired (notes go on channels in use)`);
          const logger = await loggersRepo(scope).find(channel.loggerId);
          if (!logger || logger.retiredAt)
            throw fieldRefusal('channelId', NOTE_LABELS.channelId, `the logger of "${channel.label}" is retired (notes go on loggers in use)`);
          loggerId = channel.loggerId;
          where = `"${channel.label}"`;
        } else {
          const logger = await loggersRepo(scope).find(input.loggerId!);
          if (!logger) throw fieldRefusal('loggerId', NOTE_LABELS.loggerId, 'is not a logger of this lab (pick one of its loggers)');
          if (logger.retiredAt) throw fieldRefusal('loggerId', NOTE_LABELS.loggerId, `the logger "${logger.name}" is retired (notes go on loggers in use)`);
          loggerId = logger.id;
          where = `every channel of "${logger.name}"`;
        }
        await usableKind(scope, input.kindId);
        const noteId = await notesRepo(scope).insert({
          loggerId,
          channelId: input.channelId ?? null,
          kindId: input.kindId,
          text: input.text,
          start: input.start,
          end: input.end,
          excludeFromAnalysis: input.excludeFromAnalysis,
          by: actor.id,
          at: new Date(now()),
        });
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'note.created',
          targetType: 'note',
          targetId: noteId,
          summary: `${actor.displayName} noted on ${where}: ${summaryOf(input)}`,
          details: {
            loggerId,
            channelId: input.channelId ?? null,
            kindId: input.kindId,
            from: input.start,
            to: input.end,
            excludeFromAnalysis: input.excludeFromAnalysis,
          },
        });
        return noteId;
      });
      return presentNote(await requireNote(scoped(lab), id));
    },

    /** Changes a note's kind, text, span or leave-out flag; the span must stay ordered. */
    async update(lab: LabContext, actor: Actor, noteId: number, input: UpdateNoteInput): Promise<Note> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const note = await requireNote(scope, noteId, true);
        const start = input.start ?? note.start;
        const end = input.end ?? note.end;
        if (!(end > start)) {
          const field = input.end !== undefined ? 'end' : 'start';
          throw fieldRefusal(
            field,
            NOTE_LABELS[field],
            `the note would end at or before it starts; move ${field === 'end' ? 'the end after the start' : 'the start before the end'}`,
          );
        }
        if (input.kindId !== undefined) await usableKind(scope, input.kindId, note.kindId);
        await notesRepo(scope).update(noteId, input, actor.id, new Date(now()));
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'note.updated',
          targetType: 'note',
          targetId: noteId,
          summary: `${actor.displayName} changed the note "${summaryOf({ text: input.text ?? note.text })}"`,
          details: {
            ...input,
            before: { kindId: note.kindId, from: note.start, to: note.end, excludeFromAnalysis: note.excludeFromAnalysis, text: note.text },
          },
        });
      });
      return presentNote(await requireNote(scoped(lab), noteId));
    },

    /** Deletes a note (the audit log keeps what it said). */
    async remove(lab: LabContext, actor: Actor, noteId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const note = await requireNote(scope, noteId, true);
        await notesRepo(scope).remove(noteId);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'note.deleted',
          targetType: 'note',
          targetId: noteId,
          summary: `${actor.displayName} deleted the note "${summaryOf(note)}"`,
          details: {
            loggerId: note.loggerId,
            channelId: note.channelId,
            kind: note.kindName,
            text: note.text,
            from: note.start,
            to: note.end,
            excludeFromAnalysis: note.excludeFromAnalysis,
          },
        });
      });
    },

    kinds,

    /** Adds a kind at the end of the lab's list. */
    async createKind(lab: LabContext, actor: Actor, input: CreateNoteKindInput): Promise<NoteKind> {
      const id = await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const repo = noteKindsRepo(scope);
        await repo.seedIfEmpty(DEFAULT_NOTE_KINDS);
        if (await repo.nameTaken(input.name))
          throw fieldRefusal('name', NOTE_LABELS.name, `the lab already has a kind called "${input.name}" (choose another name)`);
        const kindId = await repo.insert(input.name);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'note-kind.created',
          targetType: 'note-kind',
          targetId: kindId,
          summary: `${actor.displayName} added the note kind "${input.name}"`,
        });
        return kindId;
      });
      return (await kinds(lab)).find((k) => k.id === id)!;
    },

    /** Renames, retires or brings back a kind; notes that have it keep it. */
    async updateKind(lab: LabContext, actor: Actor, kindId: number, input: UpdateNoteKindInput): Promise<NoteKind> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const repo = noteKindsRepo(scope);
        const kind = await repo.find(kindId);
        if (!kind) throw new NotFoundError(NO_KIND);
        if (input.name !== undefined && (await repo.nameTaken(input.name, kindId))) {
          throw fieldRefusal('name', NOTE_LABELS.name, `the lab already has a kind called "${input.name}" (choose another name)`);
        }
        const retiredAt = input.retired === undefined ? undefined : input.retired ? (kind.retiredAt ?? new Date(now())) : null;
        await repo.update(kindId, { name: input.name, retiredAt });
        const what = [
          input.name !== undefined && input.name !== kind.name ? `renamed the note kind "${kind.name}" to "${input.name}"` : null,
          input.retired === true && !kind.retiredAt ? `retired the note kind "${input.name ?? kind.name}"` : null,
          input.retired === false && kind.retiredAt ? `brought back the note kind "${input.name ?? kind.name}"` : null,
        ].filter(Boolean);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'note-kind.updated',
          targetType: 'note-kind',
          targetId: kindId,
          summary: `${actor.displayName} ${what.length ? what.join(' and ') : `saved the note kind "${kind.name}" unchanged`}`,
          details: { ...input, before: { name: kind.name, retired: kind.retiredAt !== null } },
        });
      });
      return (await kinds(lab)).find((k) => k.id === kindId)!;
    },
  };
}

export type NotesService = ReturnType<typeof createNotesService>;
