import type { DbOrTrx } from './tenant-scope.ts';
import type { Role } from '../policies/permissions.ts';

export type { Role };

export interface Lab {
  id: number;
  slug: string;
  name: string;
  createdAt: Date;
}

export interface LabMembershipSummary {
  labId: number;
  slug: string;
  name: string;
  role: Role;
}

interface LabRow {
  id: number;
  slug: string;
  name: string;
  created_at: Date;
}

const toLab = (r: LabRow): Lab => ({ id: Number(r.id), slug: r.slug, name: r.name, createdAt: r.created_at });

/** Data access for `labs` (the tenants themselves). Every method takes an optional transaction. */
export function createLabsRepo(db: DbOrTrx) {
  return {
    async findBySlug(slug: string, trx: DbOrTrx = db): Promise<Lab | null> {
      const row = await trx<LabRow>('labs').where({ slug }).first();
      return row ? toLab(row) : null;
    },

    /**
     * The lab at `slug` with `userId`'s role in it, or null when there is no such lab OR the
     * person is not a member: one statement (the lab joined to that person's membership) that
     * returns nothing in both cases, so the lab guard runs the same statements and the same
     * code for someone else's lab as for a lab that does not exist.
     */
    async findForMember(slug: string, userId: number, trx: DbOrTrx = db): Promise<(Lab & { role: Role }) | null> {
      const row = await trx<LabRow>('labs')
        .join('memberships', function ownMembership() {
          this.on('memberships.tenant_id', '=', 'labs.id').andOn('memberships.user_id', '=', trx.raw('?', [userId]));
        })
        .where('labs.slug', slug)
        .first('labs.id', 'labs.slug', 'labs.name', 'labs.created_at', 'memberships.role');
      return row ? { ...toLab(row), role: (row as LabRow & { role: Role }).role } : null;
    },

    /**
     * Locks the lab's row until the transaction ends: serialises changes within one lab
     * (e.g. "no pending invitation to this address yet" → insert) without gap locks that
     * could make concurrent changes in different labs deadlock.
     */
    async lock(id: number, trx: DbOrTrx = db): Promise<void> {
      await trx('labs').where({ id }).forUpdate().first('id');
    },

    /** Inserts a lab (`createdBy`: the person creating it, null for an operator); a taken slug surfaces as the driver's ER_DUP_ENTRY error. */
    async insert(input: { slug: string; name: string; createdBy?: number | null }, trx: DbOrTrx = db): Promise<Lab> {
      const [id] = await trx('labs').insert({ slug: input.slug, name: input.name, created_by_user_id: input.createdBy ?? null });
      const row = await trx<LabRow>('labs').where({ id }).first();
      return toLab(row!);
    },

    /** Which of `slugs` labs already use (one statement, whatever the answer). */
    async takenAmong(slugs: readonly string[], trx: DbOrTrx = db): Promise<Set<string>> {
      const rows: Array<{ slug: string }> = await trx('labs').whereIn('slug', [...slugs]).select('slug');
      return new Set(rows.map((r) => r.slug));
    },

    /**
     * Locks the person's `users` row until the transaction ends, so two labs created at once by
     * the same person are counted one after the other (the per-account cap holds under races).
     * Run it before any plain read in the transaction: InnoDB takes the read view at the first
     * plain read, and it must see the other creation once that has committed.
     */
    async lockCreator(userId: number, trx: DbOrTrx = db): Promise<void> {
      await trx('users').where({ id: userId }).forUpdate().first('id');
    },

    /** How many labs this person created (operator-created labs have no creator). */
    async countCreatedBy(userId: number, trx: DbOrTrx = db): Promise<number> {
      const row = await trx('labs').where('created_by_user_id', userId).count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },

    /**
     * The billing rows (plan, status, grace) of the labs this person administers, keyed by the
     * person's own id like listForUser; labs without a row are on the free plan and not listed.
     */
    async adminPlansOf(userId: number, trx: DbOrTrx = db): Promise<Array<{ planKey: string; status: string; graceUntil: Date | null }>> {
      return trx('memberships')
        .join('lab_billing', 'lab_billing.tenant_id', 'memberships.tenant_id')
        .where('memberships.user_id', userId)
        .where('memberships.role', 'admin')
        .select('lab_billing.plan_key as planKey', 'lab_billing.status', 'lab_billing.grace_until as graceUntil');
    },

    /**
     * The labs one person belongs to, with their role in each. A cross-lab read (as is
     * adminPlansOf), keyed by the signed-in user's own id.
     */
    async listForUser(userId: number, trx: DbOrTrx = db): Promise<LabMembershipSummary[]> {
      const rows = await trx('memberships')
        .join('labs', 'labs.id', 'memberships.tenant_id')
        .where('memberships.user_id', userId)
        .orderBy('labs.name')
        .select('labs.id as labId', 'labs.slug', 'labs.name', 'memberships.role');
      return rows.map((r: LabMembershipSummary) => ({ ...r, labId: Number(r.labId) }));
    },
  };
}

export type LabsRepo = ReturnType<typeof createLabsRepo>;
