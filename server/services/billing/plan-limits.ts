import type { Db } from '../../db/create-db.ts';
import { inLab, type DbOrTrx } from '../../db/tenant-scope.ts';
import { labBillingIn } from '../../db/lab-billing.repo.ts';
import { usageIn } from '../../db/usage.repo.ts';
import type { Logger } from '../../logger.ts';
import type { IngestHooks } from '../ingest/ingest-hooks.ts';
import { effectivePlan } from './effective-plan.ts';
import { PlanLimitError } from './billing-errors.ts';
import type { Plan, PlanCatalog } from './plan-catalog.ts';
import { createUsageCounterWrites } from './usage-counter-writes.ts';

/** Plan limits at the points where usage grows: ingestion, registering a logger, inviting a member. */
export interface PlanLimitGuard {
  /** The ingestion hooks: refuse a batch past the readings limit; count what was stored. */
  ingestHooks: IngestHooks;
  /** Throws PlanLimitError when the lab has no room for one more logger or member. */
  assertRoomFor(trx: DbOrTrx, labId: number, what: 'loggers' | 'members'): Promise<void>;
  /** The plan whose limits apply to the lab now. */
  planOf(trx: DbOrTrx, labId: number): Promise<Plan>;
  /**
   * Resolves once every counter bump made so far is written (or has failed and been logged):
   * the server waits for it on shutdown, before the database pool closes.
   */
  settled(): Promise<void>;
}

/**
 * Builds the plan-limit checks.
 *
 * Readings: `beforeCommit` runs in the batch transaction once the new rows are inserted and
 * counted (`accepted` excludes duplicates), reads the lab's counter WITHOUT a lock, adds the
 * bumps this process has not yet written, and refuses the whole batch when that plus `accepted`
 * would pass the limit (exactly at the limit is allowed). `afterCommit` bumps the counter by
 * `accepted` through usage-counter-writes.ts (one write in flight per lab, bumps arriving
 * meanwhile summed). A bump whose write has just committed may be counted twice for a moment,
 * which errs towards refusing. Because the counter is read unlocked, batches of one lab
 * committing at the same moment in different processes may together pass the limit by at most
 * one batch each; the usage job then reconciles the exact count and the next batch is refused.
 * Locking a per-lab row here would serialise every logger of a lab.
 */
export function createPlanLimits(deps: { db: Db; catalog: PlanCatalog; logger: Logger; now?: () => Date }): PlanLimitGuard {
  const { catalog } = deps;
  const now = deps.now ?? (() => new Date());
  const billingOf = (trx: DbOrTrx, labId: number) => labBillingIn(inLab(trx, labId), trx, catalog.free.key);
  const counterWrites = createUsageCounterWrites(
    (labId, count) => billingOf(deps.db, labId).addReadings(count),
    (labId, err) => deps.logger.warn('usage counter update failed; the usage job will reconcile it', { labId, err: String(err) }),
  );

  async function planOf(trx: DbOrTrx, labId: number): Promise<Plan> {
    return effectivePlan(await billingOf(trx, labId).get(), catalog, now());
  }

  return {
    planOf,
    settled: () => counterWrites.settled(),
    ingestHooks: {
      async beforeCommit(trx, batch) {
        if (batch.accepted === 0) return;
        const billing = await billingOf(trx, batch.target.tenantId).get();
        const plan = effectivePlan(billing, catalog, now());
        const used = (billing?.readingsCount ?? 0) + counterWrites.pending(batch.target.tenantId);
        if (used + batch.accepted > plan.limits.readings) {
          throw new PlanLimitError('readings', { planName: plan.name, allowed: plan.limits.readings, used, adding: batch.accepted });
        }
      },
      afterCommit(batch) {
        counterWrites.add(batch.target.tenantId, batch.accepted);
      },
    },
    async assertRoomFor(trx, labId, what) {
      const plan = await planOf(trx, labId);
      const usage = usageIn(inLab(trx, labId));
      const used = what === 'loggers' ? await usage.activeLoggers() : await usage.seatsTaken(now());
      if (used + 1 > plan.limits[what]) throw new PlanLimitError(what, { planName: plan.name, allowed: plan.limits[what], used, adding: 1 });
    },
  };
}
