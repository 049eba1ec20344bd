import type { Knex } from 'knex';

/**
 * Each channel's count of stored readings, kept exact by the ingestion transaction (the same
 * statement that advances the channel's data version) and by whatever deletes readings, so a
 * lab's stored-readings usage is a sum over its channel rows (one keyed read per channel)
 * instead of a scan of readings or rollups. Filled by the next migration.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('channels', 'stored_readings')) return;
  await knex.schema.alterTable('channels', (t) => {
    t.bigInteger('stored_readings').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('channels', 'stored_readings'))) return;
  await knex.schema.alterTable('channels', (t) => t.dropColumn('stored_readings'));
}
