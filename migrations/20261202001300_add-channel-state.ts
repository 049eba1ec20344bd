import type { Knex } from 'knex';

/**
 * Channel state kept current by ingestion, so the channel overview and the diagnostics cache
 * never scan readings: the latest stored reading (time and value) and a data version that
 * every batch storing new readings for the channel increases by one.
 */
export async function up(knex: Knex): Promise<void> {
  const has = async (column: string) => knex.schema.hasColumn('channels', column);
  const missing = { ts: !(await has('last_reading_ts')), value: !(await has('last_reading_value')), version: !(await has('data_version')) };
  if (!missing.ts && !missing.value && !missing.version) return;
  await knex.schema.alterTable('channels', (t) => {
    if (missing.ts) t.bigInteger('last_reading_ts').nullable();
    if (missing.value) t.double('last_reading_value').nullable();
    if (missing.version) t.bigInteger('data_version').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const column of ['data_version', 'last_reading_value', 'last_reading_ts']) {
    if (await knex.schema.hasColumn('channels', column)) {
      await knex.schema.alterTable('channels', (t) => t.dropColumn(column));
    }
  }
}
