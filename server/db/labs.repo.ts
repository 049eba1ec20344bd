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
     * Locks the lab's row until the transaction ends: serialises changes within one lab
     * (e.g. "no pending invitation to this address yet" → insert) without gap locks that
     * could make concurrent changes in different labs deadlock.
     */
    async lock(id: number, trx: DbOrTrx = db): Promise<void> {
      await trx('labs').where({ id }).forUpdate().first('id');
    },

    /** Inserts a lab; a taken slug surfaces as the driver's ER_DUP_ENTRY error. */
    async insert(input: { slug: string; name: string }, trx: DbOrTrx = db): Promise<Lab> {
      const [id] = await trx('labs').insert({ slug: input.slug, name: input.name });
      const row = await trx<LabRow>('labs').where({ id }).first();
      return toLab(row!);
    },

    /**
     * The labs one person belongs to, with their role in each. This is the only
     * cross-lab read, and it is keyed by the signed-in user's own id.
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
