import { readFileSync } from 'node:fs';
import type { Knex } from 'knex';

/**
 * Fills `lab_billing.quarantined_count` with each lab's exact count of quarantined rows (once;
 * from then on the count is kept in the transactions that add and remove rows). A lab with
 * quarantined rows but no billing row yet gets one on the free plan of the catalog named by
 * LAGBOOK_PLANS_FILE (default tenants/plans.json), as the server would make it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('UPDATE lab_billing SET quarantined_count = (SELECT COUNT(*) FROM quarantined_rows WHERE quarantined_rows.tenant_id = lab_billing.tenant_id)');
  const orphans = await knex('quarantined_rows')
    .whereNotExists(knex('lab_billing').whereRaw('lab_billing.tenant_id = quarantined_rows.tenant_id').select(knex.raw('1')))
    .groupBy('quarantined_rows.tenant_id')
    .select('quarantined_rows.tenant_id as tenantId', knex.raw('COUNT(*) as n'));
  if (orphans.length === 0) return;
  const catalog = JSON.parse(readFileSync(process.env.LAGBOOK_PLANS_FILE ?? 'tenants/plans.json', 'utf8')) as {
    plans: Array<{ key: string; priceLookupKey: string | null }>;
  };
  const free = catalog.plans.find((p) => p.priceLookupKey === null);
  if (!free) throw new Error('backfill-lab-quarantined-count: the plan catalog has no free plan');
  for (const o of orphans as Array<{ tenantId: number; n: number }>) {
    await knex.raw(
      'INSERT INTO lab_billing (tenant_id, plan_key, quarantined_count) VALUES (?, ?, ?) ON DUPLICATE KEY UPDATE quarantined_count = VALUES(quarantined_count)',
      [o.tenantId, free.key, Number(o.n)],
    );
  }
}

/** Nothing to undo: the column itself goes with the previous migration's `down`. */
export async function down(): Promise<void> {}
