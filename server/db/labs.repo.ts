import type { DbOrTrx } from './tenant-scope.ts';

export type Role = 'admin' | 'technician' | 'scientist' | 'guest';

export interface LabMembershipSummary {
  labId: number;
  slug: string;
  name: string;
  role: Role;
}

/** Data access for `labs` (the tenants themselves). */
export function createLabsRepo(db: DbOrTrx) {
  return {
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
