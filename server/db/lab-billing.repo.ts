import type { LabScope } from './tenant-scope.ts';

/** Subscription status as Lagbook mirrors it from Stripe. */
export type BillingStatus = 'none' | 'active' | 'past_due' | 'canceled';

/** A lab's billing row (see migration 20261202001500). */
export interface LabBilling {
  tenantId: number;
  planKey: string;
  status: BillingStatus;
  stripeCustomerId: string | null;
  stripeSubscriptionId: string | null;
  graceUntil: Date | null;
  /** Stripe `created` (Unix seconds) of the newest event applied. */
  stateAt: number;
  readingsCount: number;
  /** Quarantined rows the lab keeps, counted in the transactions that add and remove them. */
  quarantinedCount: number;
  reconciledAt: Date | null;
  /** Highest usage warning already mailed (0, 80 or 100). */
  warnedPercent: number;
}

/** Fields a Stripe event may change. */
export type BillingStatePatch = Partial<Pick<LabBilling, 'planKey' | 'status' | 'stripeSubscriptionId' | 'graceUntil' | 'stateAt' | 'stripeCustomerId'>>;

const COLUMNS = [
  'lab_billing.tenant_id as tenantId',
  'lab_billing.plan_key as planKey',
  'lab_billing.status',
  'lab_billing.stripe_customer_id as stripeCustomerId',
  'lab_billing.stripe_subscription_id as stripeSubscriptionId',
  'lab_billing.grace_until as graceUntil',
  'lab_billing.state_at as stateAt',
  'lab_billing.readings_count as readingsCount',
  'lab_billing.quarantined_count as quarantinedCount',
  'lab_billing.reconciled_at as reconciledAt',
  'lab_billing.warned_percent as warnedPercent',
];

const toBilling = (r: Record<string, unknown>): LabBilling => ({
  tenantId: Number(r.tenantId),
  planKey: r.planKey as string,
  status: r.status as BillingStatus,
  stripeCustomerId: (r.stripeCustomerId as string | null) ?? null,
  stripeSubscriptionId: (r.stripeSubscriptionId as string | null) ?? null,
  graceUntil: (r.graceUntil as Date | null) ?? null,
  stateAt: Number(r.stateAt),
  readingsCount: Number(r.readingsCount),
  quarantinedCount: Number(r.quarantinedCount),
  reconciledAt: (r.reconciledAt as Date | null) ?? null,
  warnedPercent: Number(r.warnedPercent),
});

const PATCH_COLUMNS: Record<keyof BillingStatePatch, string> = {
  planKey: 'plan_key',
  status: 'status',
  stripeSubscriptionId: 'stripe_subscription_id',
  stripeCustomerId: 'stripe_customer_id',
  graceUntil: 'grace_until',
  stateAt: 'state_at',
};

/**
 * Data access for one lab's `lab_billing` row. A lab without a row is on the free plan; the
 * methods that may write make the row first, on the free plan named by `freePlanKey` (the plan
 * catalog's, which the repo does not know).
 */
export function labBillingRepo(scope: LabScope) {
  const ensure = async (freePlanKey: string) => {
    // INSERT IGNORE: two first-time writers never fail on each other. The quarantine count
    // starts from the rows already there (e.g. written by the demo seed, which bypasses the
    // ingestion hooks); from then on it is kept where rows are added and removed.
    await scope.raw(
      'INSERT IGNORE INTO lab_billing (tenant_id, plan_key, quarantined_count) SELECT :lab, ?, COUNT(*) FROM quarantined_rows WHERE quarantined_rows.tenant_id = :lab',
      [freePlanKey],
    );
  };
  return {
    /** The lab's row; `lock` takes a row lock for a read-modify-write (webhooks only, never ingestion). */
    async get(opts: { lock?: boolean } = {}): Promise<LabBilling | null> {
      const q = scope.table('lab_billing').first(COLUMNS);
      const row = await (opts.lock ? q.forUpdate() : q);
      return row ? toBilling(row) : null;
    },

    /** The row, made first (on `freePlanKey`, nothing counted) when the lab has none. */
    async getOrCreate(freePlanKey: string, opts: { lock?: boolean } = {}): Promise<LabBilling> {
      await ensure(freePlanKey);
      return (await this.get(opts))!;
    },

    async patch(patch: BillingStatePatch, freePlanKey: string): Promise<void> {
      const update: Record<string, unknown> = {};
      for (const [key, column] of Object.entries(PATCH_COLUMNS)) {
        const value = patch[key as keyof BillingStatePatch];
        if (value !== undefined) update[column] = value;
      }
      await ensure(freePlanKey);
      await scope.table('lab_billing').update({ ...update, updated_at: new Date() });
    },

    /**
     * Counts one ingest batch in the lab's row inside the batch's transaction, if it fits:
     * adds `readings` to the stored-readings counter only when the result stays within
     * `limits.readings`, and checks that the quarantine, grown by `quarantined` less
     * `quarantineFreed`, stays within `limits.quarantinedRows` (the quarantined rows themselves
     * are counted by quarantine.repo.ts when they are written). One conditional UPDATE: it
     * row-locks the counters until the transaction ends, so a concurrent batch of the same lab
     * sees this one's readings before it checks. Returns false (and changes nothing) when the
     * batch does not fit.
     */
    async reserveBatch(
      add: { readings: number; quarantined: number; quarantineFreed: number },
      limits: { readings: number; quarantinedRows: number },
      freePlanKey: string,
    ): Promise<boolean> {
      const grow = add.quarantined - add.quarantineFreed;
      const sql =
        'UPDATE lab_billing SET readings_count = readings_count + ? WHERE tenant_id = :lab AND (? = 0 OR readings_count + ? <= ?) AND (? <= 0 OR quarantined_count + ? <= ?)';
      const run = async () => {
        const [result] = await scope.raw(sql, [add.readings, add.readings, add.readings, limits.readings, grow, grow, limits.quarantinedRows]);
        return Number((result as { affectedRows: number }).affectedRows) > 0;
      };
      if (await run()) return true;
      if (await this.get()) return false;
      await ensure(freePlanKey);
      return run();
    },

    /** Replaces the counter with an exact count (the usage job). */
    async setReadings(count: number, at: Date, freePlanKey: string): Promise<void> {
      await ensure(freePlanKey);
      await scope.table('lab_billing').update({ readings_count: count, reconciled_at: at });
    },

    async setWarnedPercent(percent: number, freePlanKey: string): Promise<void> {
      await ensure(freePlanKey);
      await scope.table('lab_billing').update({ warned_percent: percent });
    },
  };
}

export type LabBillingRepo = ReturnType<typeof labBillingRepo>;
