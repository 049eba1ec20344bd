import type { Knex } from 'knex';
import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

/** One note as stored, with the names it points to (see migrations/20261203194810_create-notes.ts). */
export interface NoteRow {
  id: number;
  loggerId: number;
  loggerName: string;
  /** Null: on every channel of the logger. */
  channelId: number | null;
  channelLabel: string | null;
  kindId: number;
  kindName: string;
  kindRetired: boolean;
  text: string;
  /** Epoch ms, inclusive. */
  start: number;
  /** Epoch ms, exclusive. */
  end: number;
  excludeFromAnalysis: boolean;
  createdBy: { id: number; name: string } | null;
  createdAt: Date;
  updatedBy: { id: number; name: string } | null;
  updatedAt: Date;
}

/** What a new note holds. */
export interface NoteInsert {
  loggerId: number;
  channelId: number | null;
  kindId: number;
  text: string;
  start: number;
  end: number;
  excludeFromAnalysis: boolean;
  by: number;
  at: Date;
}

/** Which notes a list asks for: those overlapping [from, to) (either side open when left out). */
export interface NotesFilter {
  from?: number;
  to?: number;
  /** Notes of this channel and the whole-logger notes of its logger. */
  channel?: { id: number; loggerId: number };
  /** Every note of this logger (its whole-logger notes and those of each channel). */
  loggerId?: number;
  /** Only notes marked "leave out of analysis". */
  excludedOnly?: boolean;
  limit?: number;
}

const COLUMNS = [
  'notes.id',
  'notes.logger_id as loggerId',
  'loggers.name as loggerName',
  'notes.channel_id as channelId',
  'channels.label as channelLabel',
  'notes.kind_id as kindId',
  'note_kinds.name as kindName',
  'note_kinds.retired_at as kindRetiredAt',
  'notes.body as text',
  'notes.start_ts as start',
  'notes.end_ts as end',
  'notes.exclude_from_analysis as excludeFromAnalysis',
  'notes.created_by as createdById',
  'creator.display_name as createdByName',
  'notes.created_at as createdAt',
  'notes.updated_by as updatedById',
  'editor.display_name as updatedByName',
  'notes.updated_at as updatedAt',
];

const person = (id: unknown, name: unknown) =>
  id === null || id === undefined || name === null || name === undefined ? null : { id: Number(id), name: String(name) };

const toNote = (r: Record<string, unknown>): NoteRow => ({
  id: Number(r.id),
  loggerId: Number(r.loggerId),
  loggerName: String(r.loggerName ?? ''),
  channelId: r.channelId === null ? null : Number(r.channelId),
  channelLabel: r.channelLabel === null || r.channelLabel === undefined ? null : String(r.channelLabel),
  kindId: Number(r.kindId),
  kindName: String(r.kindName ?? ''),
  kindRetired: r.kindRetiredAt !== null && r.kindRetiredAt !== undefined,
  text: String(r.text),
  start: Number(r.start),
  end: Number(r.end),
  excludeFromAnalysis: Boolean(r.excludeFromAnalysis),
  createdBy: person(r.createdById, r.createdByName),
  createdAt: r.createdAt as Date,
  updatedBy: person(r.updatedById, r.updatedByName),
  updatedAt: r.updatedAt as Date,
});

/** Data access for one lab's `notes`. */
export function notesRepo(scope: LabScope) {
  /** Notes with their logger, channel, kind and people joined, all within this lab. */
  const joined = (): Knex.QueryBuilder =>
    scope
      .table('notes')
      .join('loggers', (j) => j.on('loggers.tenant_id', '=', 'notes.tenant_id').andOn('loggers.id', '=', 'notes.logger_id'))
      .leftJoin('channels', (j) => j.on('channels.tenant_id', '=', 'notes.tenant_id').andOn('channels.id', '=', 'notes.channel_id'))
      .join('note_kinds', (j) => j.on('note_kinds.tenant_id', '=', 'notes.tenant_id').andOn('note_kinds.id', '=', 'notes.kind_id'))
      .leftJoin('users as creator', 'creator.id', 'notes.created_by')
      .leftJoin('users as editor', 'editor.id', 'notes.updated_by');

  return {
    /** The notes matching `filter`, earliest start first, at most `limit` (the newest are kept when more match). */
    async list(filter: NotesFilter): Promise<{ notes: NoteRow[]; truncated: boolean }> {
      const q = joined();
      if (filter.from !== undefined) q.where('notes.end_ts', '>', filter.from);
      if (filter.to !== undefined) q.where('notes.start_ts', '<', filter.to);
      if (filter.loggerId !== undefined) q.where('notes.logger_id', filter.loggerId);
      if (filter.excludedOnly) q.where('notes.exclude_from_analysis', true);
      const channel = filter.channel;
      if (channel) {
        q.where((w) => w.where('notes.channel_id', channel.id).orWhere((o) => o.whereNull('notes.channel_id').andWhere('notes.logger_id', channel.loggerId)));
      }
      const limit = filter.limit;
      const rows = (await (limit ? q.orderBy('notes.start_ts', 'desc').limit(limit + 1) : q.orderBy('notes.start_ts')).select(COLUMNS)) as Record<
        string,
        unknown
      >[];
      const truncated = limit !== undefined && rows.length > limit;
      const kept = truncated ? rows.slice(0, limit) : rows;
      const notes = kept.map(toNote);
      if (limit) notes.sort((a, b) => a.start - b.start || a.id - b.id);
      return { notes, truncated };
    },

    /** One note of this lab, or null; `forUpdate` locks its row. */
    async find(id: number, opts: { forUpdate?: boolean } = {}): Promise<NoteRow | null> {
      const q = joined().where('notes.id', id).first(COLUMNS);
      if (opts.forUpdate) q.forUpdate();
      const row = (await q) as Record<string, unknown> | undefined;
      return row ? toNote(row) : null;
    },

    /** Stores a note; returns its id. */
    async insert(input: NoteInsert): Promise<number> {
      const id = newId();
      await scope.insert('notes', {
        id,
        logger_id: input.loggerId,
        channel_id: input.channelId,
        kind_id: input.kindId,
        body: input.text,
        start_ts: input.start,
        end_ts: input.end,
        exclude_from_analysis: input.excludeFromAnalysis,
        created_by: input.by,
        created_at: input.at,
        updated_by: input.by,
        updated_at: input.at,
      });
      return id;
    },

    /** Changes a note's kind, text, span or flag, stamping who and when. */
    async update(
      id: number,
      change: { kindId?: number; text?: string; start?: number; end?: number; excludeFromAnalysis?: boolean },
      by: number,
      at: Date,
    ): Promise<void> {
      const cols: Record<string, unknown> = { updated_by: by, updated_at: at };
      if (change.kindId !== undefined) cols.kind_id = change.kindId;
      if (change.text !== undefined) cols.body = change.text;
      if (change.start !== undefined) cols.start_ts = change.start;
      if (change.end !== undefined) cols.end_ts = change.end;
      if (change.excludeFromAnalysis !== undefined) cols.exclude_from_analysis = change.excludeFromAnalysis;
      await scope.table('notes').where('notes.id', id).update(cols);
    },

    /** Deletes a note. */
    async remove(id: number): Promise<void> {
      await scope.table('notes').where('notes.id', id).delete();
    },
  };
}
