import type { BillingOverview, InvoiceSummary } from '../../services/billing/billing.service.ts';
import type { Plan } from '../../services/billing/plan-catalog.ts';

const presentPlan = (p: Plan) => ({ key: p.key, name: p.name, summary: p.summary, monthlyAmount: p.monthlyAmount, paid: p.priceLookupKey !== null, limits: p.limits });

/** The billing page's JSON: plan, status, usage against limits, trend and the catalog. */
export function presentBillingOverview(o: BillingOverview) {
  return {
    plan: presentPlan(o.plan),
    subscribedPlanKey: o.subscribedPlanKey,
    status: o.status,
    graceUntil: o.graceUntil?.toISOString() ?? null,
    usage: o.usage,
    limits: o.limits,
    ingestionRefused: o.ingestionRefused,
    historyStartsAt: o.historyStartsAt.toISOString(),
    trend: o.trend,
    currency: o.currency,
    plans: o.plans.map(presentPlan),
  };
}

export type BillingOverviewJson = ReturnType<typeof presentBillingOverview>;

/** One invoice row (amounts in the currency's smallest unit). */
export function presentInvoice(i: InvoiceSummary) {
  return { ...i, created: i.created.toISOString() };
}

export type InvoiceJson = ReturnType<typeof presentInvoice>;
