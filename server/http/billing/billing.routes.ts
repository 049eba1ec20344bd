import {
  changePlanSchema,
  startCheckoutSchema,
  type BillingOverview,
  type BillingSessionAnswer,
  type InvoicesAnswer,
  type PlanChangeAnswer,
} from '../../contract/billing.ts';
import { presentBillingOverview, presentInvoice } from './billing.presenter.ts';
import type { BillingService } from '../../services/billing/billing.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** The 503 of a route that calls the payment service (its refusal or outage changes nothing). */
const PAYMENT_SERVICE_DOWN = {
  503: '`billing_unavailable`: the payment service cannot be reached or refused the call, the plan is unchanged (Retry-After 30 s); or `service_unavailable`: the database is unreachable, read-only or full.',
} as const;

/** The 400 of a route that names a plan: the body, or a plan the catalog does not sell this way. */
const PLAN_REFUSED = '`invalid_input`: the body failed validation (`field: reason`), or `plan` names no plan of the catalog or the free plan.';

/** A lab's plan, usage and payment (admins only: `billing.manage`). */
export function billingRoutes(deps: { billing: BillingService }): Route[] {
  const { billing } = deps;
  return [
    defineRoute({
      method: 'get',
      path: '/billing',
      auth: { permission: 'billing.manage' },
      summary: "The lab's plan, subscription status, usage against limits, 30-day trend and the plans on offer.",
      response: { status: 200, description: 'The overview the billing page shows.' },
      handle: async ({ lab }): Promise<BillingOverview> => presentBillingOverview(await billing.overview(lab)),
    }),
    defineRoute({
      method: 'post',
      path: '/billing/checkout-session',
      auth: { permission: 'billing.manage' },
      summary: 'Start paying for a plan: answers the Stripe Checkout URL to open (the plan changes when Stripe confirms).',
      body: startCheckoutSchema,
      response: { status: 201, description: 'The Checkout page to open (`url`).' },
      errors: {
        400: PLAN_REFUSED,
        409: '`subscription_exists`: the lab already has a subscription (switch plans with plan-change, or cancel in the portal).',
        ...PAYMENT_SERVICE_DOWN,
      },
      handle: async ({ lab, actor, body }): Promise<BillingSessionAnswer> => billing.startCheckout(lab, actor, body.plan),
    }),
    defineRoute({
      method: 'post',
      path: '/billing/plan-change',
      auth: { permission: 'billing.manage' },
      summary:
        'Move a paid subscription to another paid plan (prorated); 202: the plan changes when Stripe confirms. 409 plan_too_small lists what the lab already uses beyond the plan unless acknowledgeLimits is true.',
      body: changePlanSchema,
      response: { status: 202, description: 'The switch is sent; the plan changes when the payment service confirms it.' },
      errors: {
        400: PLAN_REFUSED,
        409: '`no_subscription`: nothing to change, subscribe first; `payment_overdue`: the last payment failed; `same_plan`: the lab is on that plan already; `plan_too_small`: the lab already uses more than the plan allows (the message lists what), send `acknowledgeLimits: true` to switch anyway.',
        ...PAYMENT_SERVICE_DOWN,
      },
      handle: async ({ lab, actor, body }): Promise<PlanChangeAnswer> => billing.changePlan(lab, actor, body.plan, body.acknowledgeLimits),
    }),
    defineRoute({
      method: 'post',
      path: '/billing/portal-session',
      auth: { permission: 'billing.manage' },
      summary: "Open Stripe's billing portal (card, invoices, cancellation): answers its URL.",
      response: { status: 201, description: 'The billing portal page to open (`url`).' },
      errors: PAYMENT_SERVICE_DOWN,
      handle: async ({ lab, actor }): Promise<BillingSessionAnswer> => billing.openPortal(lab, actor),
    }),
    defineRoute({
      method: 'get',
      path: '/billing/invoices',
      auth: { permission: 'billing.manage' },
      summary: "The lab's invoices with amounts and links, newest first.",
      response: { status: 200, description: 'The invoices (none before the first checkout).' },
      errors: PAYMENT_SERVICE_DOWN,
      handle: async ({ lab }): Promise<InvoicesAnswer> => ({ invoices: (await billing.invoices(lab)).map(presentInvoice) }),
    }),
  ];
}
