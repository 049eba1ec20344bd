import type { Db } from '../db/create-db.ts';
import { createLabsRepo, type Lab } from '../db/labs.repo.ts';
import { inLab } from '../db/tenant-scope.ts';
import { membershipsIn } from '../db/memberships.repo.ts';
import { auditIn } from '../db/audit.repo.ts';
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
  return {
    async create(actor: Actor, input: CreateLabInput): Promise<Lab> {
      const slug = input.slug ?? slugFromName(input.name);
      if (slug.length < 3) throw new ValidationError('slug: choose an address of at least 3 letters or digits');
      try {
        return await deps.db.transaction(async (trx) => {
          const lab = await createLabsRepo(trx).insert({ slug, name: input.name });
          const scope = inLab(trx, lab.id);
          await membershipsIn(scope).add(actor.id, 'admin');
          await auditIn(scope).record({
            actorUserId: actor.id,
            action: 'lab.created',
            targetType: 'lab',
            targetId: lab.slug,
            summary: `${actor.displayName} created the lab "${lab.name}"`,
          });
          return lab;
        });
      } catch (err) {
        if (isDuplicateKey(err)) throw new ConflictError('slug_taken', 'slug: this address is already taken');
        throw err;
      }
    },
  };
}

export type LabsService = ReturnType<typeof createLabsService>;
