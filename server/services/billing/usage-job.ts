import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { usageRepo } from '../../db/usage.repo.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import type { BackgroundJob } from '../../jobs/background-jobs.ts';
import { effectivePlan } from './effective-plan.ts';
import { usageWarningMail } from './billing-mail.ts';
import { mailLabAdmins } from './notify-admins.ts';
import type { PlanCatalog } from './plan-catalog.ts';

/** How often the job runs in the server (it also runs once right after start). */
export const USAGE_JOB_INTERVAL_MS = 15 * 60_000;

/** The warning level a usage share has reached: 100, 80 or 0 (percent). */
export function warningLevel(used: number, allowed: number): 0 | 80 | 100 {
  if (used >= allowed) return 100;
  if (used * 5 >= allowed * 4) return 80;
  return 0;
}

/**
 * The usage job: for every lab, replaces the stored-readings counter with the exact count
 * (from the day rollups), writes today's usage snapshot (the 30-day trend), and mails the
 * admins when usage crosses 80% or 100% of the plan. The level already mailed is kept in the
 * database, so each crossing mails once, even across restarts; falling back below a level
 * re-arms it. `runOnce` takes the time from `now`, so tests drive it with a simulated clock.
 */
export function createUsageJob(deps: { db: Db; catalog: PlanCatalog; mailer: Mailer; logger: LogWriter; publicUrl: string; now?: () => Date }) {
  const now = deps.now ?? (() => new Date());

  async function reconcileLab(lab: { id: number; slug: string; name: string }): Promise<void> {
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
        await locked.setReadings(c.readings, at, freePlanKey);
        return c;
      },
      { isolationLevel: 'read committed' },
    );
    await usage.saveSnapshot(at.toISOString().slice(0, 10), counts);

    const row = await billing.getOrCreate(freePlanKey);
    const plan = effectivePlan(row, deps.catalog, at);
    const level = warningLevel(counts.readings, plan.limits.readings);
    if (level > row.warnedPercent) {
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
    if (level !== row.warnedPercent) await billing.setWarnedPercent(level, freePlanKey);
  }

  async function runOnce(): Promise<void> {
    for (const lab of await crossLabRepo(deps.db).allLabs()) {
      try {
        await reconcileLab(lab);
      } catch (err) {
        // one lab's failure (e.g. the mail relay) must not hold up the others; retried next run
        deps.logger.warn('usage reconciliation failed for a lab', { labId: lab.id, err: String(err) });
      }
    }
  }

  let timer: NodeJS.Timeout | null = null;
  let running: Promise<void> | null = null;
  const tick = () => {
    if (running) return;
    // A database outage must not become an unhandled rejection (that would end the process).
    running = runOnce()
      .catch((err: unknown) => deps.logger.warn('usage reconciliation failed; the next run retries', { err: String(err) }))
      .finally(() => {
        running = null;
      });
  };
  const job: BackgroundJob = {
    name: 'usage reconciliation',
    start() {
      tick();
      timer = setInterval(tick, USAGE_JOB_INTERVAL_MS);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      await running;
    },
  };
  return { job, runOnce, reconcileLab };
}
