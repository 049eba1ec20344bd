import type { Knex } from 'knex';

/** Labs are Lagbook's tenants: every lab-owned row elsewhere carries `tenant_id` → labs.id. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('labs')) return;
  await knex.schema.createTable('labs', (t) => {
    t.bigIncrements('id').unsigned().primary();
    t.string('slug', 64).notNullable().unique();
    t.string('name', 120).notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('labs');
}
