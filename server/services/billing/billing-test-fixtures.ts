import type { LabBilling } from '../../db/lab-billing.repo.ts';
import { parsePlanCatalog } from './plan-catalog.ts';

/** A two-plan catalog for unit tests (invented limits). */
export const testCatalog = parsePlanCatalog({
  currency: 'eur',
  plans: [
    {
      key: 'seedling',
      name: 'Seedling',
      monthlyAmount: 0,
      priceLookupKey: null,
      limits: { readings: 10, loggers: 1, members: 2, historyDays: 30, quarantinedRows: 5 },
    },
    {
      key: 'transect',
      name: 'Transect',
      monthlyAmount: 4900,
      priceLookupKey: 'lagbook-transect-monthly',
      limits: { readings: 100, loggers: 5, members: 9, historyDays: 365, quarantinedRows: 50 },
    },
  ],
});

/** A lab's billing row on the paid test plan, active, with overrides. */
export function billingRow(over: Partial<LabBilling> = {}): LabBilling {
  return {
    tenantId: 1,
    planKey: 'transect',
    status: 'active',
    stripeCustomerId: 'cus_1',
    stripeSubscriptionId: 'sub_1',
    graceUntil: null,
    stateAt: 0,
    readingsCount: 0,
    quarantinedCount: 0,
    reconciledAt: null,
    warnedPercent: 0,
    ...over,
  };
}
