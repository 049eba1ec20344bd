import type { LabBilling } from '../../db/lab-billing.repo.ts';

/**
 * When a lab's effective plan took effect (epoch ms), for the retention grace
 * (`HorizonPolicy.inForceSinceMs`): the last billing state change (`stateAt`, the Stripe event's
 * time in seconds — a plan or status change) or the end of a payment grace (after which the
 * effective plan falls back to the free one without a new event), whichever is later. A lab
 * without a billing row has been on the free plan since it was made: −∞. Any other state change
 * only moves the moment later, which delays removal and never hastens it.
 */
export function planInForceSince(billing: LabBilling | null): number {
  if (!billing) return Number.NEGATIVE_INFINITY;
  const changed = billing.stateAt > 0 ? billing.stateAt * 1000 : Number.NEGATIVE_INFINITY;
  const graceEnd = billing.graceUntil ? billing.graceUntil.getTime() : Number.NEGATIVE_INFINITY;
  return Math.max(changed, graceEnd);
}
