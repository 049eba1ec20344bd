import type Stripe from 'stripe';
import type { BillingStatePatch, BillingStatus, LabBilling } from '../../db/lab-billing.repo.ts';
import type { PlanCatalog } from './plan-catalog.ts';

/** The Stripe events Lagbook acts on (enable these on the webhook endpoint). */
export const HANDLED_EVENTS = [
  'checkout.session.completed',
  'customer.subscription.created',
  'customer.subscription.updated',
  'customer.subscription.deleted',
  'invoice.paid',
  'invoice.payment_failed',
] as const;

const DAY_MS = 86_400_000;

/** Stripe subscription status → Lagbook's mirror; null for states that change nothing (incomplete, paused). */
export function mirrorStatus(status: Stripe.Subscription.Status): BillingStatus | null {
  switch (status) {
    case 'active':
    case 'trialing':
      return 'active';
    case 'past_due':
    case 'unpaid':
      return 'past_due';
    case 'canceled':
    case 'incomplete_expired':
      return 'canceled';
    default:
      return null;
  }
}

const idOf = (v: string | { id: string } | null | undefined): string | null => (v == null ? null : typeof v === 'string' ? v : v.id);

/** The customer and lab an event is about, for finding the lab. */
export function eventParties(event: Stripe.Event): { customerId: string | null; labIdHint: string | null } {
  const object = event.data.object as unknown as {
    customer?: string | { id: string } | null;
    metadata?: Record<string, string> | null;
    client_reference_id?: string | null;
  };
  return { customerId: idOf(object.customer), labIdHint: object.client_reference_id ?? object.metadata?.lab_id ?? null };
}

function invoiceSubscription(invoice: Stripe.Invoice): string | null {
  return idOf(invoice.parent?.subscription_details?.subscription ?? null);
}

/**
 * What one verified Stripe event changes in a lab's billing row, or null when it changes
 * nothing. Pure, so ordering rules are unit-tested:
 * - state (plan, status, grace) follows only events at least as new as the newest applied
 *   (`event.created >= row.stateAt`), so an older event arriving late never rolls it back;
 * - the customer and subscription ids are linked from any event while the row has none;
 * - events about another subscription than the lab's current one are ignored, except a new
 *   subscription once the old one is cancelled;
 * - entering past due starts the grace period (`graceDays` after the event); staying past
 *   due keeps its end; any return to active or cancelled clears it.
 */
export function billingChange(event: Stripe.Event, row: LabBilling, ctx: { catalog: PlanCatalog; graceDays: number }): BillingStatePatch | null {
  const { catalog } = ctx;
  const stale = event.created < row.stateAt;
  const link: BillingStatePatch = {};
  let state: BillingStatePatch | null = null;
  const enterStatus = (status: BillingStatus): BillingStatePatch => {
    if (status === 'past_due')
      return { status, graceUntil: row.status === 'past_due' && row.graceUntil ? row.graceUntil : new Date(event.created * 1000 + ctx.graceDays * DAY_MS) };
    return { status, graceUntil: null };
  };
  const subscriptionIsCurrent = (id: string) =>
    !row.stripeSubscriptionId || row.stripeSubscriptionId === id || row.status === 'canceled' || row.status === 'none';

  switch (event.type) {
    case 'checkout.session.completed': {
      const session = event.data.object;
      if (session.mode !== 'subscription') return null;
      const subscriptionId = idOf(session.subscription);
      const plan = catalog.byKey(session.metadata?.plan_key ?? '');
      if (!row.stripeCustomerId && idOf(session.customer)) link.stripeCustomerId = idOf(session.customer);
      if (subscriptionId && subscriptionIsCurrent(subscriptionId)) {
        if (row.stripeSubscriptionId !== subscriptionId) link.stripeSubscriptionId = subscriptionId;
        if (plan?.priceLookupKey && session.payment_status === 'paid') state = { planKey: plan.key, ...enterStatus('active') };
      }
      break;
    }
    case 'customer.subscription.created':
    case 'customer.subscription.updated': {
      const sub = event.data.object;
      if (!subscriptionIsCurrent(sub.id)) return null;
      const status = mirrorStatus(sub.status);
      const lookupKey = sub.items?.data?.[0]?.price?.lookup_key ?? null;
      const plan = (lookupKey ? catalog.byLookupKey(lookupKey) : undefined) ?? catalog.byKey(sub.metadata?.plan_key ?? '');
      if (!status || !plan) return null;
      if (row.stripeSubscriptionId !== sub.id) link.stripeSubscriptionId = sub.id;
      state = status === 'canceled' ? { planKey: catalog.free.key, ...enterStatus('canceled') } : { planKey: plan.key, ...enterStatus(status) };
      break;
    }
    case 'customer.subscription.deleted': {
      const sub = event.data.object;
      if (row.stripeSubscriptionId && row.stripeSubscriptionId !== sub.id) return null;
      state = { planKey: catalog.free.key, ...enterStatus('canceled'), stripeSubscriptionId: null };
      break;
    }
    case 'invoice.paid':
    case 'invoice.payment_failed': {
      const subscriptionId = invoiceSubscription(event.data.object);
      if (!subscriptionId || row.stripeSubscriptionId !== subscriptionId) return null;
      if (row.status !== 'active' && row.status !== 'past_due') return null;
      state = enterStatus(event.type === 'invoice.paid' ? 'active' : 'past_due');
      break;
    }
    default:
      return null;
  }
  const patch: BillingStatePatch = stale || !state ? link : { ...link, ...state, stateAt: event.created };
  return Object.keys(patch).length > 0 ? patch : null;
}
