import type { Knex } from 'knex';

/**
 * The lab's count of quarantined rows beside its stored-readings counter, so the plan's
 * quarantine cap is checked (and shown on the billing page) without counting the rows. Kept
 * exact in the same transactions that add and remove quarantined rows.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('lab_billing', 'quarantined_count')) return;
  await knex.schema.alterTable('lab_billing', (t) => {
    t.bigInteger('quarantined_count').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('lab_billing', 'quarantined_count'))) return;
  await knex.schema.alterTable('lab_billing', (t) => t.dropColumn('quarantined_count'));
}
