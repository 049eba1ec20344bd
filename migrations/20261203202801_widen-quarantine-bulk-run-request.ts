import type { Knex } from 'knex';

/**
 * A bulk repair's request may name up to 10,000 rows by id (about 16 bytes each as JSON text),
 * more than a TEXT column holds (65,535 bytes): the request becomes MEDIUMTEXT (16 MiB).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE quarantine_bulk_runs MODIFY request MEDIUMTEXT NOT NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE quarantine_bulk_runs MODIFY request TEXT NOT NULL');
}
