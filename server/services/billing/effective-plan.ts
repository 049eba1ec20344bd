import type { LabBilling } from '../../db/lab-billing.repo.ts';
import type { Plan, PlanCatalog } from './plan-catalog.ts';

const DAY_MS = 86_400_000;

/**
 * The plan whose limits apply now: the paid plan while the subscription is active, or past due
 * but still inside its grace period; the free plan otherwise (no subscription, cancelled, grace
 * over, or a plan key the catalog no longer has).
 */
export function effectivePlan(billing: LabBilling | null, catalog: PlanCatalog, now: Date): Plan {
  if (!billing) return catalog.free;
  const plan = catalog.byKey(billing.planKey);
  if (!plan) return catalog.free;
  if (billing.status === 'active') return plan;
  if (billing.status === 'past_due' && billing.graceUntil && billing.graceUntil.getTime() > now.getTime()) return plan;
  return catalog.free;
}

/**
 * The earliest reading time (epoch ms) the plan lets the lab browse and analyse: `historyDays`
 * before now. Older readings stay stored (unless the plan's `readingRemoval` is on) and become
 * visible again with a longer plan.
 */
export function historyStart(plan: Plan, nowMs: number): number {
  return nowMs - plan.limits.historyDays * DAY_MS;
}
