import type Stripe from 'stripe';
import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { labBillingRepo, type BillingStatus } from '../../db/lab-billing.repo.ts';
import { usageRepo, type UsageCounts, type UsageSnapshot } from '../../db/usage.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { ConflictError, fieldRefusal } from '../service-errors.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import { effectivePlan, historyStart } from './effective-plan.ts';
import { BillingUnavailableError } from './billing-errors.ts';
import { clampToHistory, type HistoryWindow } from './plan-history.ts';
import type { Plan, PlanCatalog, PlanLimits } from './plan-catalog.ts';
import { BILLING_LABELS, BILLING_REASONS } from '../../contract/words/billing.ts';

/** What the billing page shows. */
export interface BillingOverview {
  /** The plan whose limits apply now. */
  plan: Plan;
  /** The plan Stripe last confirmed (differs from `plan` once a grace period is over). */
  subscribedPlanKey: string;
  status: BillingStatus;
  graceUntil: Date | null;
  /** What the lab uses; `quarantinedRows` is the kept count of rows in quarantine. */
  usage: UsageCounts & { quarantinedRows: number };
  limits: PlanLimits;
  /** True when stored readings are at or over the limit: ingestion is refused. */
  ingestionRefused: boolean;
  historyStartsAt: Date;
  trend: UsageSnapshot[];
  currency: string;
  plans: readonly Plan[];
}

/** One invoice as the billing page lists it. */
export interface InvoiceSummary {
  id: string;
  number: string | null;
  status: string | null;
  currency: string;
  amountDue: number;
  amountPaid: number;
  created: Date;
  hostedUrl: string | null;
  pdfUrl: string | null;
}

const TREND_DAYS = 30;

/** The limits of `limits` that `used` already passes, in words ("40 loggers, the lab has 52"). */
function overLimits(used: { readings: number; loggers: number; members: number }, limits: PlanLimits): string[] {
  const words = { readings: 'stored readings', loggers: 'active loggers', members: 'members' } as const;
  return (Object.keys(words) as Array<keyof typeof words>)
    .filter((k) => used[k] > limits[k])
    .map((k) => `${limits[k].toLocaleString('en')} ${words[k]} and the lab has ${used[k].toLocaleString('en')}`);
}

/** Anything the Stripe SDK throws becomes a typed 503 (the plan is never touched on this path). */
async function callStripe<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch {
    throw new BillingUnavailableError();
  }
}

/**
 * A lab's plan and payment through Stripe, for its admins: usage against limits, starting a
 * Checkout Session, opening the billing portal, listing invoices. Nothing here changes the
 * lab's plan: only a verified webhook does (see stripe-webhooks.service.ts).
 */
export function createBillingService(deps: { db: Db; stripe: Stripe; catalog: PlanCatalog; publicUrl: string; now?: () => Date }) {
  const { db, stripe, catalog } = deps;
  const now = deps.now ?? (() => new Date());
  const billingOf = (labId: number) => labBillingRepo(inLab(db, labId));
  const pageUrl = (lab: LabContext) => `${deps.publicUrl}/labs/${encodeURIComponent(lab.slug)}/billing`;

  /** The lab's Stripe customer, created (with the lab id in its metadata) the first time. */
  async function customerFor(lab: LabContext, actor: Actor): Promise<string> {
    const row = await billingOf(lab.id).getOrCreate(catalog.free.key);
    if (row.stripeCustomerId) return row.stripeCustomerId;
    const customer = await callStripe(() =>
      stripe.customers.create({ name: lab.name, email: actor.email, metadata: { lab_id: String(lab.id), lab_slug: lab.slug } }),
    );
    await billingOf(lab.id).patch({ stripeCustomerId: customer.id }, catalog.free.key);
    return customer.id;
  }

  /** What the lab uses against each limit: the stored-readings counter given, loggers and seats counted. */
  async function usageCounts(labId: number, readings: number, at: Date): Promise<UsageCounts> {
    const usage = usageRepo(inLab(db, labId));
    return { readings, loggers: await usage.activeLoggers(), members: await usage.seatsTaken(at) };
  }

  /** The active Stripe price a paid plan is sold under (found by its lookup key). */
  async function priceOf(plan: Plan): Promise<Stripe.Price> {
    const lookupKey = plan.priceLookupKey;
    if (!lookupKey) throw new Error(`priceOf: the ${plan.name} plan is free and has no price`); // callers refuse free plans first
    const prices = await callStripe(() => stripe.prices.list({ lookup_keys: [lookupKey], active: true, limit: 1 }));
    const price = prices.data[0];
    if (!price)
      throw new BillingUnavailableError(
        `The payment service has no price "${lookupKey}" for the ${plan.name} plan; your plan is unchanged. Tell the Lagbook operator.`,
      );
    return price;
  }

  return {
    /** Plan, status, usage against limits, the 30-day trend and the catalog. */
    async overview(lab: LabContext): Promise<BillingOverview> {
      const at = now();
      const row = await billingOf(lab.id).get();
      const plan = effectivePlan(row, catalog, at);
      const usage = usageRepo(inLab(db, lab.id));
      const counts = await usageCounts(lab.id, row?.readingsCount ?? 0, at);
      const since = new Date(at.getTime() - (TREND_DAYS - 1) * 86_400_000).toISOString().slice(0, 10);
      return {
        plan,
        subscribedPlanKey: row?.planKey ?? catalog.free.key,
        status: row?.status ?? 'none',
        graceUntil: row?.status === 'past_due' ? row.graceUntil : null,
        usage: { ...counts, quarantinedRows: row?.quarantinedCount ?? 0 },
        limits: plan.limits,
        ingestionRefused: counts.readings >= plan.limits.readings,
        historyStartsAt: new Date(historyStart(plan, at.getTime())),
        trend: await usage.snapshotsSince(since),
        currency: catalog.currency,
        plans: catalog.plans,
      };
    },

    /**
     * A time range under the lab's plan history: the plan lets the lab browse and analyse only its
     * last `historyDays` (older readings stay stored unless the plan's `readingRemoval` is on). The range comes back unchanged, or starting
     * at the window with `cutAtMs` set, or is refused with 402 when it lies wholly before the
     * window (`clampToHistory`). The channel browser, diagnostics, comparisons and exports all
     * pass their range through here.
     */
    async clampToPlanHistory<Q extends { from: number; to: number }>(lab: { id: number }, q: Q): Promise<{ range: Q; cutAtMs: number | null }> {
      const plan = effectivePlan(await billingOf(lab.id).get(), catalog, now());
      const window: HistoryWindow = {
        earliestMs: historyStart(plan, now().getTime()),
        historyDays: plan.limits.historyDays,
        removesOlder: plan.readingRemoval?.enabled ?? false,
      };
      return clampToHistory(window, q);
    },

    /**
     * Starts a Stripe Checkout Session for a paid plan and returns its URL. The plan changes
     * only when Stripe's `checkout.session.completed` webhook arrives. A lab that already has a
     * subscription switches plans with `changePlan` or cancels in the billing portal instead.
     */
    async startCheckout(lab: LabContext, actor: Actor, planKey: string): Promise<{ url: string }> {
      const plan = catalog.byKey(planKey);
      if (!plan) throw fieldRefusal('plan', BILLING_LABELS.plan, BILLING_REASONS.unknownPlan);
      if (!plan.priceLookupKey)
        throw fieldRefusal('plan', BILLING_LABELS.plan, 'the free plan needs no payment; to return to it, cancel the subscription under "Manage payment"');
      const row = await billingOf(lab.id).getOrCreate(catalog.free.key);
      if (row.stripeSubscriptionId && (row.status === 'active' || row.status === 'past_due')) {
        throw new ConflictError('subscription_exists', 'The lab already has a subscription: switch to another plan, or cancel it under "Manage payment".');
      }
      const customer = await customerFor(lab, actor);
      const price = await priceOf(plan);
      const metadata = { lab_id: String(lab.id), plan_key: plan.key };
      const session = await callStripe(() =>
        stripe.checkout.sessions.create({
          mode: 'subscription',
          customer,
          client_reference_id: String(lab.id),
          line_items: [{ price: price.id, quantity: 1 }],
          metadata,
          subscription_data: { metadata },
          success_url: `${pageUrl(lab)}?checkout=complete`,
          cancel_url: `${pageUrl(lab)}?checkout=cancelled`,
        }),
      );
      if (!session.url) throw new BillingUnavailableError();
      await auditRepo(inLab(db, lab.id)).record({
        actorUserId: actor.id,
        action: 'billing.checkout-started',
        targetType: 'lab',
        targetId: lab.id,
        summary: `${actor.displayName} started checkout for the ${plan.name} plan`,
        details: { plan: plan.key, session: session.id },
      });
      return { url: session.url };
    },

    /**
     * Moves the lab's subscription to another paid plan: the subscription item gets the new
     * plan's price and Stripe prorates the difference onto the next invoice. Like a checkout,
     * it changes nothing here: the plan follows Stripe's `customer.subscription.updated`
     * webhook. Refused (409) without an active subscription, for the plan already paid for,
     * and — unless `acknowledgeLimits` — when the lab already uses more than the new plan
     * allows (stored readings, loggers, members), with what exceeds in the message.
     */
    async changePlan(lab: LabContext, actor: Actor, planKey: string, acknowledgeLimits: boolean): Promise<{ plan: string; message: string }> {
      const plan = catalog.byKey(planKey);
      if (!plan) throw fieldRefusal('plan', BILLING_LABELS.plan, BILLING_REASONS.unknownPlan);
      if (!plan.priceLookupKey)
        throw fieldRefusal('plan', BILLING_LABELS.plan, `to return to the ${plan.name} plan, cancel the subscription under "Manage payment"`);
      const row = await billingOf(lab.id).get();
      if (!row?.stripeSubscriptionId || row.status === 'canceled' || row.status === 'none') {
        throw new ConflictError('no_subscription', 'The lab has no subscription to change: choose a plan to subscribe to it.');
      }
      if (row.status !== 'active')
        throw new ConflictError('payment_overdue', 'The last payment failed: settle it under "Manage payment" before changing the plan.');
      if (row.planKey === plan.key) throw new ConflictError('same_plan', `The lab is already on the ${plan.name} plan.`);
      const over = overLimits(await usageCounts(lab.id, row.readingsCount, now()), plan.limits);
      if (over.length > 0 && !acknowledgeLimits) {
        throw new ConflictError(
          'plan_too_small',
          `The ${plan.name} plan allows ${over.join('; ')}. Nothing is deleted, but while the lab is over a limit it cannot add more of that (new readings are refused while stored readings are at the limit). Confirm to switch anyway.`,
        );
      }
      const subscriptionId = row.stripeSubscriptionId;
      const [price, subscription] = await Promise.all([priceOf(plan), callStripe(() => stripe.subscriptions.retrieve(subscriptionId))]);
      const item = subscription.items.data[0];
      if (!item) throw new BillingUnavailableError();
      await callStripe(() =>
        stripe.subscriptions.update(subscriptionId, {
          items: [{ id: item.id, price: price.id }],
          proration_behavior: 'create_prorations',
          metadata: { lab_id: String(lab.id), plan_key: plan.key },
        }),
      );
      const from = catalog.byKey(row.planKey)?.name ?? row.planKey;
      await auditRepo(inLab(db, lab.id)).record({
        actorUserId: actor.id,
        action: 'billing.plan-change-requested',
        targetType: 'lab',
        targetId: lab.id,
        summary: `${actor.displayName} asked to move the subscription from the ${from} plan to the ${plan.name} plan`,
        details: { from: row.planKey, to: plan.key, overLimits: over },
      });
      return {
        plan: plan.key,
        message: `The switch to the ${plan.name} plan is sent; the plan changes as soon as the payment service confirms it. The price difference is prorated on the next invoice.`,
      };
    },

    /** A billing-portal session (card, invoices, cancellation) that returns to the billing page. */
    async openPortal(lab: LabContext, actor: Actor): Promise<{ url: string }> {
      const customer = await customerFor(lab, actor);
      const session = await callStripe(() => stripe.billingPortal.sessions.create({ customer, return_url: pageUrl(lab) }));
      return { url: session.url };
    },

    /** The lab's invoices, newest first (none before its first checkout). */
    async invoices(lab: LabContext): Promise<InvoiceSummary[]> {
      const row = await billingOf(lab.id).get();
      if (!row?.stripeCustomerId) return [];
      const customer = row.stripeCustomerId;
      const list = await callStripe(() => stripe.invoices.list({ customer, limit: 24 }));
      return list.data.map((i) => ({
        id: i.id ?? '',
        number: i.number,
        status: i.status,
        currency: i.currency,
        amountDue: i.amount_due,
        amountPaid: i.amount_paid,
        created: new Date(i.created * 1000),
        hostedUrl: i.hosted_invoice_url ?? null,
        pdfUrl: i.invoice_pdf ?? null,
      }));
    },
  };
}

export type BillingService = ReturnType<typeof createBillingService>;
