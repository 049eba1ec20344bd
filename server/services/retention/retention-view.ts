import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { retentionLabRepo, retentionRecordsRepo } from '../../db/retention.repo.ts';
import { effectivePlan } from '../billing/effective-plan.ts';
import type { Plan, PlanCatalog } from '../billing/plan-catalog.ts';
import { removalHorizon, removalStartsAt } from './retention-plan.ts';
import { planInForceSince } from './plan-in-force-since.ts';
import { RETENTION_INTERVAL_MS } from './retention-job.ts';

/** What the lab's admins are told about retention (the presenter turns times into ISO text). */
export type RetentionView =
  | { removes: false; plan: Plan }
  | { removes: true; plan: Plan; horizonMs: number; oldestReadingMs: number | null; readingsBeforeHorizon: number; nextRemovalMs: number };

/**
 * When the next removal runs: a day after the latest run started, or now when no run has
 * started yet or the day is over (the job runs at start and then daily).
 */
export function nextRemovalAt(latestStartMs: number | null, nowMs: number): number {
  if (latestStartMs === null) return nowMs;
  return Math.max(nowMs, latestStartMs + RETENTION_INTERVAL_MS);
}

/**
 * The lab's retention as its admins see it on the billing page: whether its effective plan ever
 * removes readings and, if so, the horizon, the oldest stored reading, how many readings lie
 * before the horizon now and when the next removal runs. Reads are keyed: one step per channel.
 */
export function createRetentionView(deps: { db: Db; catalog: PlanCatalog; now?: () => Date }) {
  const now = deps.now ?? (() => new Date());
  return {
    async forLab(lab: { id: number }): Promise<RetentionView> {
      const at = now().getTime();
      const scope = inLab(deps.db, lab.id);
      const billing = await labBillingRepo(scope).get();
      const plan = effectivePlan(billing, deps.catalog, now());
      if (!plan.readingRemoval.enabled) return { removes: false, plan };
      const policy = { historyDays: plan.limits.historyDays, readingRemoval: plan.readingRemoval, inForceSinceMs: planInForceSince(billing) };
      // a plan that took effect lately removes nothing until its export days have passed: show the horizon as of then
      const startsAt = Math.max(at, removalStartsAt(policy));
      const horizonMs = removalHorizon(policy, startsAt);
      const repo = retentionLabRepo(scope);
      let readingsBeforeHorizon = 0;
      let oldestReadingMs: number | null = null;
      for (const channelId of await repo.channelIds()) {
        readingsBeforeHorizon += await repo.readingsBefore(channelId, horizonMs);
        const oldest = await repo.oldestReading(channelId);
        if (oldest !== null && (oldestReadingMs === null || oldest < oldestReadingMs)) oldestReadingMs = oldest;
      }
      const latest = await retentionRecordsRepo(deps.db).latestRun();
      return {
        removes: true,
        plan,
        horizonMs,
        oldestReadingMs,
        readingsBeforeHorizon,
        nextRemovalMs: Math.max(startsAt, nextRemovalAt(latest ? latest.startedAt.getTime() : null, at)),
      };
    },
  };
}

export type RetentionViewService = ReturnType<typeof createRetentionView>;
