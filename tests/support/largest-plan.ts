import { join } from 'node:path';
import type { Db } from '../../server/db/create-db.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';
import { labBillingRepo } from '../../server/db/lab-billing.repo.ts';
import { inLab } from '../../server/db/tenant-scope.ts';

const CATALOG = join(import.meta.dirname, '..', '..', 'tenants', 'plans.json');

/**
 * Puts a lab on the catalog's largest plan, as an active subscription would, for tests and
 * benchmarks that measure something other than plan limits (rate limits, speed) and must not
 * be refused by them. Billing's own tests set plans through verified webhooks instead.
 */
export async function onLargestPlan(db: Db, tenantId: number): Promise<void> {
  const catalog = loadPlanCatalog(CATALOG);
  const largest = [...catalog.plans].sort((a, b) => b.limits.readings - a.limits.readings)[0];
  await labBillingRepo(inLab(db, tenantId)).patch({ planKey: largest.key, status: 'active' }, catalog.free.key);
}
