import type { Knex } from 'knex';

/**
 * A lab's description (`labs.description`): plain text an admin writes on the lab settings page
 * and the lab overview shows; at most 1,000 characters (the contract's limit), empty by default.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('labs', 'description')) return;
  await knex.schema.alterTable('labs', (t) => {
    t.string('description', 1000).notNullable().defaultTo('');
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('labs', 'description'))) return;
  await knex.schema.alterTable('labs', (t) => {
    t.dropColumn('description');
  });
}
