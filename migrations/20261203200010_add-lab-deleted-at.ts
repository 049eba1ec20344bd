import type { Knex } from 'knex';

/**
 * When an admin deleted the lab (`labs.deleted_at`): from that moment the lab guard, a person's
 * lab list, invitation links, ingest keys and the scheduled jobs skip the lab while the deletion
 * job removes its rows in batches; the row itself goes last. Null for a lab in use.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('labs', 'deleted_at')) return;
  await knex.schema.alterTable('labs', (t) => {
    t.datetime('deleted_at', { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('labs', 'deleted_at'))) return;
  await knex.schema.alterTable('labs', (t) => {
    t.dropColumn('deleted_at');
  });
}
