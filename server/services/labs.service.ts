import { randomBytes } from 'node:crypto';
import type { Db } from '../db/create-db.ts';
import { labsRepo, type Lab, type LabsRepo } from '../db/labs.repo.ts';
import { crossLabRepo, type CrossLabRepo } from '../db/cross-lab.repo.ts';
import { inLab, type DbOrTrx } from '../db/tenant-scope.ts';
import { membershipsRepo } from '../db/memberships.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { usersRepo } from '../db/users.repo.ts';
import type { LabBilling } from '../db/lab-billing.repo.ts';
import { slugFromName } from '../policies/lab-slug.ts';
import { effectivePlan } from './billing/effective-plan.ts';
import type { PlanCatalog } from './billing/plan-catalog.ts';
import { ConflictError, isDuplicateKey, fieldRefusal, fieldConflict } from './service-errors.ts';
import { retryTransaction } from '../db/retry-transaction.ts';
import { AppError } from '../errors.ts';
import type { Actor } from './lab-context.ts';
import type { CreateLabInput, UpdateLabInput } from '../contract/labs.ts';
import { NotFoundError } from '../errors.ts';
import type { LabContext } from './lab-context.ts';
import { LAB_LABELS } from '../contract/words/labs.ts';

/** A lab a person created, and the address they asked for (the lab's own may differ: see create). */
export interface CreatedLab {
  lab: Lab;
  requestedSlug: string;
}

/** How many labs one person may create (see Config.labCreation). */
export interface LabCreationCaps {
  perAccount: number;
  /** For a person who is admin of at least one lab on a paid plan. */
  perPaidAdmin: number;
}

/** Longest lab address the API accepts (labSlugSchema); variants are cut to fit it. */
const MAX_SLUG_LENGTH = 48;
/** Addresses tried in order when the requested one is unavailable: "x", "x-2" … "x-9". */
export const SLUG_VARIANTS = 9;
/** Whole creation retried this many times when another creation took the chosen address meanwhile. */
const CREATE_ATTEMPTS = 10;

/** `slug` with `suffix` appended, cut so the whole stays within MAX_SLUG_LENGTH (no hyphen before the suffix doubles). */
function withSuffix(slug: string, suffix: string): string {
  return `${slug.slice(0, MAX_SLUG_LENGTH - suffix.length).replace(/-+$/, '')}${suffix}`;
}

/**
 * The addresses a person's new lab may get for a requested `slug`, in order of preference: the
 * slug itself, then "-2" … "-9" appended (cut to 48 characters). Creation takes the first free
 * one, so a taken address answers exactly like a free one, only with another address.
 */
export function slugCandidates(slug: string): string[] {
  return [slug, ...Array.from({ length: SLUG_VARIANTS - 1 }, (_, i) => withSuffix(slug, `-${i + 2}`))];
}

/** The person has created as many labs as their account may. */
export class LabLimitError extends AppError {
  constructor(detail: { created: number; allowed: number; paidAdmin: boolean; perPaidAdmin: number }) {
    const raise = !detail.paidAdmin && detail.perPaidAdmin > detail.allowed ? ` Admins of a lab on a paid plan may create up to ${detail.perPaidAdmin}.` : '';
    super(
      403,
      'lab_limit_reached',
      detail.paidAdmin
        ? `You have created ${detail.created} labs; an admin of a lab on a paid plan may create at most ${detail.allowed}.`
        : `You have created ${detail.created} labs; one account may create at most ${detail.allowed}.${raise}`,
    );
  }
}

/**
 * Creating labs. The creator becomes the lab's first admin, in the same transaction.
 * A person's creation never tells them whether an address belongs to another lab: an address
 * in use gets the next free variant, with the same answer as a free one. A person may create
 * `caps.perAccount` labs (more, `caps.perPaidAdmin`, once they administer a lab on a paid plan);
 * their `users` row is locked while counting, so creations at once cannot pass the cap together.
 */
export function createLabsService(deps: { db: Db; caps?: LabCreationCaps; catalog?: PlanCatalog; now?: () => Date }) {
  const now = deps.now ?? (() => new Date());

  /** Inserts the lab at `slug`, its first admin (if known) and the audit event, in `trx`. */
  async function insertLab(trx: DbOrTrx, slug: string, name: string, actor: Actor | null, adminUserId: number | null): Promise<Lab> {
    const lab = await labsRepo(trx).insert({ slug, name, createdBy: actor?.id ?? null });
    const scope = inLab(trx, lab.id);
    if (adminUserId !== null) await membershipsRepo(scope).add(adminUserId, 'admin');
    await auditRepo(scope).record({
      actorUserId: actor?.id ?? null,
      action: 'lab.created',
      targetType: 'lab',
      targetId: lab.slug,
      summary: `${actor?.displayName ?? 'A Lagbook operator'} created the lab "${lab.name}"`,
    });
    return lab;
  }

  /** Refuses with LabLimitError when the person has created as many labs as they may. */
  async function checkCap(repo: LabsRepo, crossLab: CrossLabRepo, userId: number, caps: LabCreationCaps, catalog: PlanCatalog): Promise<void> {
    const created = await repo.countCreatedBy(userId);
    if (created < caps.perAccount) return;
    const at = now();
    // effectivePlan reads only the plan, status and grace period of a billing row.
    const paidAdmin = (await crossLab.adminPlansOf(userId)).some((b) => effectivePlan(b as LabBilling, catalog, at).key !== catalog.free.key);
    const allowed = paidAdmin ? caps.perPaidAdmin : caps.perAccount;
    if (created >= allowed) throw new LabLimitError({ created, allowed, paidAdmin, perPaidAdmin: caps.perPaidAdmin });
  }

  function requestedSlugOf(input: CreateLabInput): string {
    const slug = input.slug ?? slugFromName(input.name);
    if (slug.length < 3) throw fieldRefusal('slug', LAB_LABELS.slug, 'choose an address of at least 3 letters or digits');
    return slug;
  }

  /** The lab as stored now (name and description may have changed since the guard read it). */
  async function current(db: DbOrTrx, lab: LabContext): Promise<Lab> {
    const found = await labsRepo(db).findById(lab.id);
    if (!found) throw new NotFoundError('No lab at this address, or you are not a member of it.');
    return found;
  }

  return {
    /** The lab the guard resolved, with its description (read in the guard's one statement, not again). */
    detail(lab: LabContext): Lab {
      return { id: lab.id, slug: lab.slug, name: lab.name, description: lab.description, createdAt: lab.createdAt };
    },

    /**
     * An admin renames the lab and/or changes its description. The address (slug) stays, so links
     * keep working. One transaction with the audit event (old and new values); an unchanged value
     * is not logged as a change. A lock conflict reruns the whole transaction (`retryTransaction`).
     */
    async update(lab: LabContext, actor: Actor, input: UpdateLabInput): Promise<Lab> {
      return retryTransaction(() =>
        deps.db.transaction(async (trx) => {
          const repo = labsRepo(trx);
          await repo.lock(lab.id);
          const before = await current(trx, lab);
          const changes: { name?: string; description?: string } = {};
          if (input.name !== undefined && input.name !== before.name) changes.name = input.name;
          if (input.description !== undefined && input.description !== before.description) changes.description = input.description;
          if (Object.keys(changes).length === 0) return before;
          const after = (await repo.update(lab.id, changes))!;
          const what = [
            changes.name !== undefined ? `renamed the lab from "${before.name}" to "${after.name}"` : null,
            changes.description !== undefined ? 'changed its description' : null,
          ]
            .filter(Boolean)
            .join(' and ');
          await auditRepo(inLab(trx, lab.id)).record({
            actorUserId: actor.id,
            action: 'lab.updated',
            targetType: 'lab',
            targetId: lab.slug,
            summary: `${actor.displayName} ${what}`,
            details: {
              ...(changes.name !== undefined ? { name: { from: before.name, to: after.name } } : {}),
              ...(changes.description !== undefined ? { description: { from: before.description, to: after.description } } : {}),
            },
          });
          return after;
        }),
      );
    },

    /**
     * A signed-in person creates a lab and becomes its admin. The lab gets the requested
     * address, or the first free of its variants (slugCandidates; a random suffix if all are in
     * use); the answer is the same either way apart from the address.
     */
    async create(actor: Actor, input: CreateLabInput): Promise<CreatedLab> {
      const { caps, catalog } = deps;
      if (!caps || !catalog) throw new Error('labs service: creating labs for people needs the creation caps and the plan catalog');
      const requestedSlug = requestedSlugOf(input);
      const candidates = slugCandidates(requestedSlug);
      for (let attempt = 1; ; attempt++) {
        try {
          // a lock conflict (a deadlock on the slug key, or a Galera certification failure) reruns the
          // whole transaction with back-off; what still conflicts answers 503 (nothing was created)
          const lab = await retryTransaction(() =>
            deps.db.transaction(async (trx) => {
              const repo = labsRepo(trx);
              await repo.lockCreator(actor.id);
              await checkCap(repo, crossLabRepo(trx), actor.id, caps, catalog);
              const taken = await repo.takenAmong(candidates);
              const slug = candidates.find((c) => !taken.has(c)) ?? withSuffix(requestedSlug, `-${randomBytes(3).toString('hex')}`);
              return insertLab(trx, slug, input.name, actor, actor.id);
            }),
          );
          return { lab, requestedSlug };
        } catch (err) {
          // Someone else's creation took the chosen address between the look-up and the insert: start again.
          if (!isDuplicateKey(err)) throw err;
          if (attempt >= CREATE_ATTEMPTS) throw new ConflictError('slug_busy', 'Many labs are being created at this address right now; please try again.');
        }
      }
    },

    /**
     * An operator creates a lab for someone (ops CLI): that person becomes admin at once if
     * they have signed in before (verified e-mail), otherwise when they accept the invitation.
     * Operators name the exact address: a taken one is refused (409 slug_taken), not varied.
     */
    async createForOperator(input: CreateLabInput & { adminEmail: string }): Promise<{ lab: Lab; adminUserId: number | null }> {
      const existing = await usersRepo(deps.db).findByVerifiedEmail(input.adminEmail.toLowerCase());
      const slug = requestedSlugOf(input);
      try {
        const lab = await retryTransaction(() => deps.db.transaction((trx) => insertLab(trx, slug, input.name, null, existing?.id ?? null)));
        return { lab, adminUserId: existing?.id ?? null };
      } catch (err) {
        if (isDuplicateKey(err)) throw fieldConflict('slug_taken', 'slug', LAB_LABELS.slug, 'this address is already taken');
        throw err;
      }
    },
  };
}

export type LabsService = ReturnType<typeof createLabsService>;
