import type { BillingOverview as OverviewRecord, InvoiceSummary } from '../../services/billing/billing.service.ts';
import type { Plan } from '../../services/billing/plan-catalog.ts';
import type { BillingOverview, BillingPlan, Invoice } from '../../contract/billing.ts';
import { isoTime } from '../presenters/iso-time.ts';

const presentPlan = (p: Plan): BillingPlan => ({
  key: p.key,
  name: p.name,
  summary: p.summary,
  monthlyAmount: p.monthlyAmount,
  paid: p.priceLookupKey !== null,
  limits: p.limits,
});

/** The billing page's JSON: plan, status, usage against limits, trend and the catalog. */
export function presentBillingOverview(o: OverviewRecord): BillingOverview {
  return {
    plan: presentPlan(o.plan),
    subscribedPlanKey: o.subscribedPlanKey,
    status: o.status,
    graceUntil: isoTime(o.graceUntil),
    usage: o.usage,
    limits: o.limits,
    ingestionRefused: o.ingestionRefused,
    historyStartsAt: isoTime(o.historyStartsAt),
    trend: o.trend,
    currency: o.currency,
    plans: o.plans.map(presentPlan),
  };
}

/** One invoice row (amounts in the currency's smallest unit). */
export function presentInvoice(i: InvoiceSummary): Invoice {
  return { ...i, created: isoTime(i.created) };
}
