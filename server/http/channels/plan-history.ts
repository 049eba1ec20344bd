import type { BillingService } from '../../services/billing/billing.service.ts';

/** The billing service's plan-history rule, which the channel routes pass their ranges through. */
export type PlanHistory = Pick<BillingService, 'clampToPlanHistory'>;

/**
 * Passes a range through the lab's plan history (the rule is the billing service's
 * `clampToPlanHistory`: clamp the start, or 402 when the range lies wholly before the window)
 * and, whenever the range was cut, says so in the `Lagbook-History-Starts` header (ISO 8601).
 * Without a billing service every range passes unchanged.
 */
export async function withinPlanHistory<Q extends { from: number; to: number }>(
  billing: PlanHistory | undefined,
  lab: { id: number },
  q: Q,
  setHeader: (name: string, value: string) => void,
): Promise<Q> {
  if (!billing) return q;
  const { range, cutAtMs } = await billing.clampToPlanHistory(lab, q);
  if (cutAtMs !== null) setHeader('Lagbook-History-Starts', new Date(cutAtMs).toISOString());
  return range;
}
