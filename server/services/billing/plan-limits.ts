import type { Db } from '../../db/create-db.ts';
import { inLab, type DbOrTrx } from '../../db/tenant-scope.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { usageRepo } from '../../db/usage.repo.ts';
import type { LogWriter } from '../../log-writer.ts';
import type { IngestHooks, StoredBatch } from '../ingest/ingest-hooks.ts';
import { effectivePlan } from './effective-plan.ts';
import { PlanLimitError } from './billing-errors.ts';
import type { Plan, PlanCatalog } from './plan-catalog.ts';

/** Plan limits at the points where usage grows: ingestion, registering a logger, inviting a member. */
export interface PlanLimitGuard {
  /** The ingestion hooks: count a batch's readings and quarantined rows, refusing it past the plan's limits. */
  ingestHooks: IngestHooks;
  /** Throws PlanLimitError when the lab has no room for one more logger or member. */
  assertRoomFor(trx: DbOrTrx, labId: number, what: 'loggers' | 'members'): Promise<void>;
  /** The plan whose limits apply to the lab now. */
  planOf(trx: DbOrTrx, labId: number): Promise<Plan>;
}

/**
 * Builds the plan-limit checks.
 *
 * Readings and quarantine: `beforeCommit` runs in the batch transaction once the new rows are
 * inserted and counted (`accepted` excludes duplicates) and counts the batch in the lab's
 * `lab_billing` row with one conditional UPDATE (`reserveBatch`): the readings are added to the
 * counter only if the result stays within the plan, and the quarantine may grow only within its
 * cap. That row stays locked until the batch commits or rolls back, so a concurrent batch of the
 * same lab — in this process or another — reads a counter that already includes every batch
 * ahead of it: stored readings never pass the limit as counted, whatever the number of batches
 * in flight. A batch that does not fit is refused whole (PlanLimitError, 402, Retry-After;
 * nothing of it is written). Only the short tail of a batch (its quarantine rows, if any, and COMMIT)
 * runs under the lock, so loggers of one lab queue for milliseconds, not for their batches.
 * The quarantined rows themselves are counted where they are written (quarantine.repo.ts), in the
 * same transaction. A batch with nothing new to store or quarantine takes no lock.
 */
export function createPlanLimits(deps: { db: Db; catalog: PlanCatalog; logger: LogWriter; now?: () => Date }): PlanLimitGuard {
  const { catalog } = deps;
  const now = deps.now ?? (() => new Date());
  const billingOf = (trx: DbOrTrx, labId: number) => labBillingRepo(inLab(trx, labId));

  async function planOf(trx: DbOrTrx, labId: number): Promise<Plan> {
    return effectivePlan(await billingOf(trx, labId).get(), catalog, now());
  }

  /** The limit a batch that did not fit passes, with the figures for its message (read after the refusal). */
  async function refusal(trx: DbOrTrx, batch: StoredBatch): Promise<PlanLimitError> {
    const billing = await billingOf(trx, batch.target.tenantId).get();
    const plan = effectivePlan(billing, catalog, now());
    const readings = billing?.readingsCount ?? 0;
    if (batch.accepted > 0 && readings + batch.accepted > plan.limits.readings) {
      return new PlanLimitError('readings', { planName: plan.name, allowed: plan.limits.readings, used: readings, adding: batch.accepted });
    }
    const growth = batch.quarantined - (batch.replacesQuarantined ?? 0);
    return new PlanLimitError('quarantinedRows', {
      planName: plan.name,
      allowed: plan.limits.quarantinedRows,
      used: billing?.quarantinedCount ?? 0,
      adding: growth,
    });
  }

  return {
    planOf,
    ingestHooks: {
      async beforeCommit(trx, batch) {
        if (batch.accepted === 0 && batch.quarantined === 0) return;
        const plan = await planOf(trx, batch.target.tenantId);
        const fits = await billingOf(trx, batch.target.tenantId).reserveBatch(
          { readings: batch.accepted, quarantined: batch.quarantined, quarantineFreed: batch.replacesQuarantined ?? 0 },
          plan.limits,
          catalog.free.key,
        );
        if (!fits) throw await refusal(trx, batch);
      },
    },
    async assertRoomFor(trx, labId, what) {
      const plan = await planOf(trx, labId);
      const usage = usageRepo(inLab(trx, labId));
      const used = what === 'loggers' ? await usage.activeLoggers() : await usage.seatsTaken(now());
      if (used + 1 > plan.limits[what]) throw new PlanLimitError(what, { planName: plan.name, allowed: plan.limits[what], used, adding: 1 });
    },
  };
}
