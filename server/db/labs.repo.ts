import type { DbOrTrx } from './tenant-scope.ts';
import type { Role } from '../policies/permissions.ts';

export type { Role };

export interface Lab {
  id: number;
  slug: string;
  name: string;
  /** Plain text the admins wrote about the lab ('' when none). */
  description: string;
  createdAt: Date;
}

export interface LabMembershipSummary {
  labId: number;
  slug: string;
  name: string;
  role: Role;
}

/** A `labs` row as stored (cross-lab.repo.ts reads it too). */
export interface LabRow {
  id: number;
  slug: string;
  name: string;
  description: string;
  created_at: Date;
}

/** A selected `labs` row as a Lab. */
export const toLab = (r: LabRow): Lab => ({ id: Number(r.id), slug: r.slug, name: r.name, description: r.description ?? '', createdAt: r.created_at });

/** The columns of `labs` a Lab is made of (qualified, for joins). */
export const LAB_COLUMNS = ['labs.id', 'labs.slug', 'labs.name', 'labs.description', 'labs.created_at'] as const;

/**
 * Data access for `labs` (the tenants themselves, not lab-owned), on `db` — a connection or a
 * transaction. Lookups of lab-owned rows made before a lab is known (a person's labs, the lab
 * guard's slug-and-member read) live in cross-lab.repo.ts.
 */
export function labsRepo(db: DbOrTrx) {
  return {
    /** The lab at this address, or null — also for a lab being deleted (nobody may open it any more). */
    async findBySlug(slug: string): Promise<Lab | null> {
      const row = await db<LabRow>('labs')
        .where({ slug })
        .whereNull('deleted_at')
        .first(...LAB_COLUMNS);
      return row ? toLab(row) : null;
    },

    /** The lab with this id, or null, also for a lab being deleted (a webhook names a lab by id in its metadata; alert mail needs the name). */
    async findById(id: number): Promise<Lab | null> {
      const row = await db<LabRow>('labs')
        .where({ id })
        .whereNull('deleted_at')
        .first(...LAB_COLUMNS);
      return row ? toLab(row) : null;
    },

    /** Sets the name and/or description (the address never changes); returns the lab as stored now. */
    async update(id: number, patch: { name?: string; description?: string }): Promise<Lab | null> {
      const changes: Record<string, unknown> = { updated_at: db.fn.now(3) };
      if (patch.name !== undefined) changes.name = patch.name;
      if (patch.description !== undefined) changes.description = patch.description;
      await db('labs').where({ id }).whereNull('deleted_at').update(changes);
      const row = await db<LabRow>('labs')
        .where({ id })
        .whereNull('deleted_at')
        .first(...LAB_COLUMNS);
      return row ? toLab(row) : null;
    },

    /** Marks the lab deleted at `at` (the lab guard and every lookup skip it from then on); false if it already was. */
    async markDeleted(id: number, at: Date): Promise<boolean> {
      return (await db('labs').where({ id }).whereNull('deleted_at').update({ deleted_at: at })) === 1;
    },

    /** Opens a lab marked deleted again (a deletion that could not cancel the subscription, before any row went). */
    async unmarkDeleted(id: number): Promise<void> {
      await db('labs').where({ id }).update({ deleted_at: null });
    },

    /**
     * Locks the lab's row until the transaction ends: serialises changes within one lab
     * (e.g. "no pending invitation to this address yet" → insert) without gap locks that
     * could make concurrent changes in different labs deadlock.
     */
    async lock(id: number): Promise<void> {
      await db('labs').where({ id }).forUpdate().first('id');
    },

    /** Inserts a lab (`createdBy`: the person creating it, null for an operator); a taken slug surfaces as the driver's ER_DUP_ENTRY error. */
    async insert(input: { slug: string; name: string; createdBy?: number | null }): Promise<Lab> {
      const [id] = await db('labs').insert({ slug: input.slug, name: input.name, created_by_user_id: input.createdBy ?? null });
      const row = await db<LabRow>('labs')
        .where({ id })
        .first(...LAB_COLUMNS);
      return toLab(row!);
    },

    /** Which of `slugs` labs already use (one statement, whatever the answer). */
    async takenAmong(slugs: readonly string[]): Promise<Set<string>> {
      const rows: Array<{ slug: string }> = await db('labs')
        .whereIn('slug', [...slugs])
        .select('slug');
      return new Set(rows.map((r) => r.slug));
    },

    /**
     * Locks the person's `users` row until the transaction ends, so two labs created at once by
     * the same person are counted one after the other (the per-account cap holds under races).
     * Run it before any plain read in the transaction: InnoDB takes the read view at the first
     * plain read, and it must see the other creation once that has committed.
     */
    async lockCreator(userId: number): Promise<void> {
      await db('users').where({ id: userId }).forUpdate().first('id');
    },

    /** How many labs this person created (operator-created labs have no creator). */
    async countCreatedBy(userId: number): Promise<number> {
      const row = await db('labs').where('created_by_user_id', userId).count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },
  };
}

export type LabsRepo = ReturnType<typeof labsRepo>;
