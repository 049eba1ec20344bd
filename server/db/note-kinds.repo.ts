import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

/** One row of a lab's `note_kinds`, with how many notes use it. */
export interface NoteKindRow {
  id: number;
  name: string;
  position: number;
  retiredAt: Date | null;
  notes: number;
}

/** Data access for one lab's `note_kinds` (the list a lab sorts its notes by). */
export function noteKindsRepo(scope: LabScope) {
  return {
    /** Every kind of the lab, retired ones too, in list order, with its count of notes. */
    async list(): Promise<NoteKindRow[]> {
      const kinds: Array<Record<string, unknown>> = await scope
        .table('note_kinds')
        .orderBy(['note_kinds.position', 'note_kinds.name'])
        .select('note_kinds.id', 'note_kinds.name', 'note_kinds.position', 'note_kinds.retired_at as retiredAt');
      const counts = (await scope.table('notes').groupBy('notes.kind_id').select('notes.kind_id as kindId').count({ n: '*' })) as Array<{
        kindId: unknown;
        n: unknown;
      }>;
      const used = new Map(counts.map((c) => [Number(c.kindId), Number(c.n)]));
      return kinds.map((k) => ({
        id: Number(k.id),
        name: String(k.name),
        position: Number(k.position),
        retiredAt: (k.retiredAt as Date | null) ?? null,
        notes: used.get(Number(k.id)) ?? 0,
      }));
    },

    /** A kind of this lab, or null. */
    async find(id: number): Promise<{ id: number; name: string; retiredAt: Date | null } | null> {
      const row = await scope.table('note_kinds').where('note_kinds.id', id).first('note_kinds.id', 'note_kinds.name', 'note_kinds.retired_at as retiredAt');
      return row ? { id: Number(row.id), name: String(row.name), retiredAt: (row.retiredAt as Date | null) ?? null } : null;
    },

    /** Whether another kind of this lab already has `name` (case and accents as the column's collation compares them). */
    async nameTaken(name: string, exceptId?: number): Promise<boolean> {
      const q = scope.table('note_kinds').where('note_kinds.name', name);
      if (exceptId !== undefined) q.whereNot('note_kinds.id', exceptId);
      return (await q.first('note_kinds.id')) !== undefined;
    },

    /**
     * Gives a lab that has no kinds yet the starting list. INSERT IGNORE on the unique name:
     * two first requests at once leave one copy of each.
     */
    async seedIfEmpty(names: readonly string[]): Promise<void> {
      const existing = await scope.table('note_kinds').first('note_kinds.id');
      if (existing) return;
      await scope
        .insert(
          'note_kinds',
          names.map((name, position) => ({ id: newId(), name, position })),
        )
        .onConflict(['tenant_id', 'name'])
        .ignore();
    },

    /** Adds a kind at the end of the list; returns its id. */
    async insert(name: string): Promise<number> {
      const id = newId();
      const [{ last }] = (await scope.table('note_kinds').max({ last: 'note_kinds.position' })) as Array<{ last: number | null }>;
      await scope.insert('note_kinds', { id, name, position: (last ?? -1) + 1 });
      return id;
    },

    /** Renames, retires (`retiredAt` a date) or brings back (`retiredAt` null) a kind. */
    async update(id: number, change: { name?: string; retiredAt?: Date | null }): Promise<void> {
      const cols: Record<string, unknown> = {};
      if (change.name !== undefined) cols.name = change.name;
      if (change.retiredAt !== undefined) cols.retired_at = change.retiredAt;
      if (Object.keys(cols).length) await scope.table('note_kinds').where('note_kinds.id', id).update(cols);
    },
  };
}
