import type { LabScope } from './tenant-scope.ts';
import type { Role } from '../policies/permissions.ts';

export interface Member {
  userId: number;
  name: string;
  email: string;
  role: Role;
  joinedAt: Date;
}

/** Data access for one lab's `memberships`; every query starts at the lab scope. */
export function membershipsRepo(scope: LabScope) {
  return {
    async roleOf(userId: number): Promise<Role | null> {
      const row = await scope.table('memberships').where('memberships.user_id', userId).first('role');
      return row ? (row.role as Role) : null;
    },

    async list(): Promise<Member[]> {
      const rows = await scope
        .table('memberships')
        .join('users', 'users.id', 'memberships.user_id')
        .orderBy([{ column: 'users.display_name' }, { column: 'users.id' }])
        .select('users.id as userId', 'users.display_name as name', 'users.email', 'memberships.role', 'memberships.created_at as joinedAt');
      return rows.map((r: Member) => ({ ...r, userId: Number(r.userId) }));
    },

    async find(userId: number): Promise<Member | null> {
      const row = await scope
        .table('memberships')
        .join('users', 'users.id', 'memberships.user_id')
        .where('memberships.user_id', userId)
        .first('users.id as userId', 'users.display_name as name', 'users.email', 'memberships.role', 'memberships.created_at as joinedAt');
      return row ? { ...row, userId: Number(row.userId) } : null;
    },

    async add(userId: number, role: Role): Promise<void> {
      await scope.insert('memberships', { user_id: userId, role });
    },

    async setRole(userId: number, role: Role): Promise<void> {
      await scope.table('memberships').where('memberships.user_id', userId).update({ role, updated_at: new Date() });
    },

    async remove(userId: number): Promise<void> {
      await scope.table('memberships').where('memberships.user_id', userId).delete();
    },

    /**
     * The lab's admins, with their membership rows locked until the transaction ends, so two
     * concurrent demotions cannot both see "another admin remains".
     */
    async lockAdmins(): Promise<number[]> {
      const rows = await scope.table('memberships').where('memberships.role', 'admin').forUpdate().select('user_id');
      return rows.map((r: { user_id: number }) => Number(r.user_id));
    },
  };
}

export type MembershipsRepo = ReturnType<typeof membershipsRepo>;
