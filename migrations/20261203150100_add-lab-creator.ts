import type { Knex } from 'knex';

/**
 * Who created each lab (`labs.created_by_user_id`, null for labs an operator created), so the
 * number of labs one account may create can be capped. Labs are the tenants themselves, not a
 * lab-owned table: the index leads with the creator because the cap counts per person.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('labs', 'created_by_user_id')) return;
  await knex.schema.alterTable('labs', (t) => {
    t.bigInteger('created_by_user_id').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL').withKeyName('labs_created_by_foreign');
    t.index(['created_by_user_id'], 'labs_created_by_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('labs', 'created_by_user_id'))) return;
  await knex.schema.alterTable('labs', (t) => {
    t.dropForeign(['created_by_user_id'], 'labs_created_by_foreign');
    t.dropIndex(['created_by_user_id'], 'labs_created_by_index');
    t.dropColumn('created_by_user_id');
  });
}
