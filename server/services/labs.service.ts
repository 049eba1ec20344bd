import type { Db } from '../db/create-db.ts';
import { createLabsRepo, type Lab } from '../db/labs.repo.ts';
import { inLab } from '../db/tenant-scope.ts';
import { membershipsIn } from '../db/memberships.repo.ts';
import { auditIn } from '../db/audit.repo.ts';
import { createUsersRepo } from '../db/users.repo.ts';
import { slugFromName } from '../policies/lab-slug.ts';
import { ConflictError, isDuplicateKey } from './service-errors.ts';
import { ValidationError } from '../errors.ts';
import type { Actor } from './lab-context.ts';

export interface CreateLabInput {
  name: string;
  slug?: string;
}

/** Creating labs. The creator becomes the lab's first admin, in the same transaction. */
export function createLabsService(deps: { db: Db }) {
  async function createLab(input: CreateLabInput, actor: Actor | null, adminUserId: number | null): Promise<Lab> {
    const slug = input.slug ?? slugFromName(input.name);
    if (slug.length < 3) throw new ValidationError('slug: choose an address of at least 3 letters or digits');
    try {
      return await deps.db.transaction(async (trx) => {
        const lab = await createLabsRepo(trx).insert({ slug, name: input.name });
        const scope = inLab(trx, lab.id);
        if (adminUserId !== null) await membershipsIn(scope).add(adminUserId, 'admin');
        await auditIn(scope).record({
          actorUserId: actor?.id ?? null,
          action: 'lab.created',
          targetType: 'lab',
          targetId: lab.slug,
          summary: `${actor?.displayName ?? 'A Lagbook operator'} created the lab "${lab.name}"`,
        });
        return lab;
      });
    } catch (err) {
      if (isDuplicateKey(err)) throw new ConflictError('slug_taken', 'slug: this address is already taken');
      throw err;
    }
  }

  return {
    /** A signed-in person creates a lab and becomes its admin. */
    create(actor: Actor, input: CreateLabInput): Promise<Lab> {
      return createLab(input, actor, actor.id);
    },

    /**
     * An operator creates a lab for someone (ops CLI): that person becomes admin at once if
     * they have signed in before (verified e-mail), otherwise when they accept the invitation.
     */
    async createForOperator(input: CreateLabInput & { adminEmail: string }): Promise<{ lab: Lab; adminUserId: number | null }> {
      const existing = await createUsersRepo(deps.db).findByVerifiedEmail(input.adminEmail.toLowerCase());
      const lab = await createLab(input, null, existing?.id ?? null);
      return { lab, adminUserId: existing?.id ?? null };
    },
  };
}

export type LabsService = ReturnType<typeof createLabsService>;
