import { actorOf, labOf } from '../middleware/lab-guard.ts';
import { parseInput } from '../validate.ts';
import { changePlanSchema, startCheckoutSchema } from './billing.schema.ts';
import { presentBillingOverview, presentInvoice } from './billing.presenter.ts';
import type { BillingService } from '../../services/billing/billing.service.ts';
import type { LabRoute } from '../lab-routes.ts';

/** A lab's plan, usage and payment (admins only: `billing.manage`). */
export function billingRoutes(deps: { billing: BillingService }): LabRoute[] {
  const { billing } = deps;
  return [
    {
      method: 'get',
      path: '/billing',
      permission: 'billing.manage',
      summary: "The lab's plan, subscription status, usage against limits, 30-day trend and the plans on offer.",
      handle: async (_req, res) => {
        res.json(presentBillingOverview(await billing.overview(labOf(res))));
      },
    },
    {
      method: 'post',
      path: '/billing/checkout-session',
      permission: 'billing.manage',
      summary: 'Start paying for a plan: answers the Stripe Checkout URL to open (the plan changes when Stripe confirms).',
      body: startCheckoutSchema,
      handle: async (req, res) => {
        const { plan } = parseInput(startCheckoutSchema, req.body);
        res.status(201).json(await billing.startCheckout(labOf(res), actorOf(req), plan));
      },
    },
    {
      method: 'post',
      path: '/billing/plan-change',
      permission: 'billing.manage',
      summary: 'Move a paid subscription to another paid plan (prorated); 202: the plan changes when Stripe confirms. 409 plan_too_small lists what the lab already uses beyond the plan unless acknowledgeLimits is true.',
      body: changePlanSchema,
      handle: async (req, res) => {
        const { plan, acknowledgeLimits } = parseInput(changePlanSchema, req.body);
        res.status(202).json(await billing.changePlan(labOf(res), actorOf(req), plan, acknowledgeLimits));
      },
    },
    {
      method: 'post',
      path: '/billing/portal-session',
      permission: 'billing.manage',
      summary: "Open Stripe's billing portal (card, invoices, cancellation): answers its URL.",
      handle: async (req, res) => {
        res.status(201).json(await billing.openPortal(labOf(res), actorOf(req)));
      },
    },
    {
      method: 'get',
      path: '/billing/invoices',
      permission: 'billing.manage',
      summary: "The lab's invoices with amounts and links, newest first.",
      handle: async (_req, res) => {
        res.json({ invoices: (await billing.invoices(labOf(res))).map(presentInvoice) });
      },
    },
  ];
}
