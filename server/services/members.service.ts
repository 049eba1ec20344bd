import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { membershipsRepo, type Member } from '../db/memberships.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { labsRepo } from '../db/labs.repo.ts';
import type { Role } from '../policies/permissions.ts';
import { NotFoundError } from '../errors.ts';
import { LastAdminError } from './service-errors.ts';
import type { Actor, LabContext } from './lab-context.ts';

/**
 * Members of a lab: list, change a role, remove, leave. Every change runs in one
 * transaction that locks the lab's admin rows first, so the last admin can never be
 * demoted or removed, even by two admins acting at once.
 */
export function createMembersService(deps: { db: Db }) {
  async function guardLastAdmin(lab: LabContext, trx: Db, userId: number, newRole: Role | null) {
    await labsRepo(trx).lock(lab.id);
    const admins = await membershipsRepo(inLab(trx, lab.id)).lockAdmins();
    if (admins.includes(userId) && newRole !== 'admin' && admins.length === 1) throw new LastAdminError();
  }

  return {
    list(lab: LabContext): Promise<Member[]> {
      return membershipsRepo(inLab(deps.db, lab.id)).list();
    },

    async changeRole(lab: LabContext, actor: Actor, userId: number, role: Role): Promise<Member> {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const members = membershipsRepo(scope);
        const member = await members.find(userId);
        if (!member) throw new NotFoundError('No such member in this lab.');
        if (member.role === role) return member;
        await guardLastAdmin(lab, trx as unknown as Db, userId, role);
        await members.setRole(userId, role);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'member.role-changed',
          targetType: 'user',
          targetId: userId,
          summary: `${actor.displayName} changed ${member.name}'s role from ${member.role} to ${role}`,
          details: { email: member.email, from: member.role, to: role },
        });
        return { ...member, role };
      });
    },

    async remove(lab: LabContext, actor: Actor, userId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const members = membershipsRepo(scope);
        const member = await members.find(userId);
        if (!member) throw new NotFoundError('No such member in this lab.');
        await guardLastAdmin(lab, trx as unknown as Db, userId, null);
        await members.remove(userId);
        const self = userId === actor.id;
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: self ? 'member.left' : 'member.removed',
          targetType: 'user',
          targetId: userId,
          summary: self ? `${member.name} left the lab` : `${actor.displayName} removed ${member.name} from the lab`,
          details: { email: member.email, role: member.role },
        });
      });
    },
  };
}

export type MembersService = ReturnType<typeof createMembersService>;
