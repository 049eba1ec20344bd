import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { usageRepo } from '../../db/usage.repo.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { repeatingJob } from '../../jobs/background-jobs.ts';
import { createLeaseRunner, LeaseLostError, processHolderName, type HeldLease } from '../../jobs/job-lease.ts';
import { cycleStart, jobCycles } from '../../jobs/job-cycles.ts';
import { effectivePlan } from './effective-plan.ts';
import { usageWarningMail } from './billing-mail.ts';
import { mailLabAdmins } from './notify-admins.ts';
import type { PlanCatalog } from './plan-catalog.ts';

/** How often the job runs in the server (it also runs once right after start). */
export const USAGE_JOB_INTERVAL_MS = 15 * 60_000;

/** The lease that lets one app server reconcile usage for every lab at a time. */
export const USAGE_LEASE = 'usage-reconciliation';

/**
 * How long the lease holds without renewal. The run renews it after every lab, so this only has
 * to outlast one lab's reconciliation (a few keyed reads and writes, and mail); a server that
 * dies mid-run leaves the next one waiting at most this long.
 */
export const USAGE_LEASE_TTL_MS = 5 * 60_000;

/** What one run of the usage job did (`cycleDone`: this 15-minute cycle already ran on some server). */
export type UsageRunSummary = { ran: true; labs: number; failed: number } | { ran: false; heldBy: string } | { ran: false; cycleDone: true };

/** The warning level a usage share has reached: 100, 80 or 0 (percent). */
export function warningLevel(used: number, allowed: number): 0 | 80 | 100 {
  if (used >= allowed) return 100;
  if (used * 5 >= allowed * 4) return 80;
  return 0;
}

/**
 * The usage job: for every lab, replaces the lab's stored-readings counter with the exact count
 * (the sum of its channels' counters, one keyed row per channel), writes today's usage snapshot
 * (the 30-day trend), and mails the admins when usage crosses 80% or 100% of the plan. The level
 * already mailed is kept in the database, so each crossing mails once, even across restarts;
 * falling back below a level re-arms it. `runOnce` takes the time from `now`, so tests drive it
 * with a simulated clock.
 *
 * A run holds the cluster-wide lease {@link USAGE_LEASE} (`job-lease.ts`): however many app
 * servers are up, one reconciles at a time and the others skip their run. Before each write the
 * lease's fencing number is checked, so a server that lost the lease (it stalled past the TTL
 * and another took over) stops instead of writing beside the new holder. `holder` names this
 * process in the lease (unique per process by default).
 */
export function createUsageJob(deps: {
  db: Db;
  catalog: PlanCatalog;
  mailer: Mailer;
  logger: LogWriter;
  publicUrl: string;
  now?: () => Date;
  holder?: string;
  /** Claim each cycle of this length in job_runs, once across all servers (the app passes USAGE_JOB_INTERVAL_MS; tests may leave it out). */
  cycleMs?: number;
}) {
  const now = deps.now ?? (() => new Date());
  const leases = createLeaseRunner({ db: deps.db, holder: deps.holder ?? processHolderName(), now });
  const cycles = jobCycles(deps.db);

  /**
   * Reconciles one lab. With `lease` (the job's run), each write first checks the lease is still
   * held and throws LeaseLostError otherwise; without it (a caller that guards the lab itself,
   * as tests do) it just writes.
   */
  async function reconcileLab(lab: { id: number; slug: string; name: string }, lease?: HeldLease): Promise<void> {
    const stillHeld = async () => {
      if (lease) await lease.assertHeld();
    };
    const labId = lab.id;
    const scope = inLab(deps.db, labId);
    const usage = usageRepo(scope);
    const billing = labBillingRepo(scope);
    const freePlanKey = deps.catalog.free.key;
    const at = now();
    // The recount and its write hold the lab's billing row: a batch counts itself in that row
    // inside its own transaction (plan-limits.ts), so it either committed before the recount
    // reads (and is in it) or adds itself on top of the recount afterwards — none is lost.
    const counts = await deps.db.transaction(
      async (trx) => {
        const locked = labBillingRepo(inLab(trx, labId));
        await locked.getOrCreate(freePlanKey, { lock: true });
        const inTrx = usageRepo(inLab(trx, labId));
        const c = { readings: await inTrx.storedReadings(), loggers: await inTrx.activeLoggers(), members: await inTrx.seatsTaken(at) };
        await stillHeld();
        await locked.setReadings(c.readings, at, freePlanKey);
        return c;
      },
      { isolationLevel: 'read committed' },
    );
    await stillHeld();
    await usage.saveSnapshot(at.toISOString().slice(0, 10), counts);

    const row = await billing.getOrCreate(freePlanKey);
    const plan = effectivePlan(row, deps.catalog, at);
    const level = warningLevel(counts.readings, plan.limits.readings);
    if (level > row.warnedPercent) {
      await stillHeld();
      const link = `${deps.publicUrl}/labs/${lab.slug}/billing`;
      await mailLabAdmins(deps.db, deps.mailer, labId, (to) =>
        usageWarningMail({
          to,
          labName: lab.name,
          planName: plan.name,
          percent: level as 80 | 100,
          used: counts.readings,
          allowed: plan.limits.readings,
          link,
        }),
      );
    }
    if (level !== row.warnedPercent) {
      await stillHeld();
      await billing.setWarnedPercent(level, freePlanKey);
    }
  }

  /**
   * Reconciles every lab if this process gets the lease; otherwise skips quietly (another
   * server is reconciling). A lost lease ends the run at once (the new holder carries on).
   */
  async function runOnce(): Promise<UsageRunSummary> {
    const outcome = await leases.run(USAGE_LEASE, USAGE_LEASE_TTL_MS, async (lease) => {
      const period = deps.cycleMs === undefined ? null : cycleStart(now().getTime(), deps.cycleMs);
      if (period && !(await cycles.claim(lease, period, now()))) return null;
      let labs = 0;
      let failed = 0;
      for (const lab of await crossLabRepo(deps.db).allLabs()) {
        await lease.renew();
        labs++;
        try {
          await reconcileLab(lab, lease);
        } catch (err) {
          if (err instanceof LeaseLostError) throw err;
          // one lab's failure (e.g. the mail relay) must not hold up the others; retried next run
          failed++;
          deps.logger.warn('usage reconciliation failed for a lab', { labId: lab.id, err: String(err) });
        }
      }
      if (period) {
        await cycles.finish(lease, period, now());
        await cycles.prune(USAGE_LEASE, now().getTime());
      }
      return { labs, failed };
    });
    if (!outcome.ran) {
      deps.logger.info('usage reconciliation skipped: another server holds the lease', { lease: USAGE_LEASE, heldBy: outcome.heldBy });
      return outcome;
    }
    if (outcome.value === null) return { ran: false, cycleDone: true };
    return { ran: true, ...outcome.value };
  }

  const job = repeatingJob({
    name: 'usage reconciliation',
    everyMs: USAGE_JOB_INTERVAL_MS,
    run: runOnce,
    logger: deps.logger,
    failedMessage: 'usage reconciliation failed; the next run retries',
  });
  return { job, runOnce, reconcileLab };
}
