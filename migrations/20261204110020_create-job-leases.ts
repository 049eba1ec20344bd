import type { Knex } from 'knex';

/**
 * Leases for work that must run once across every app server (usage reconciliation, storage
 * maintenance, retention): one row per job name, saying who holds it, until when, and a fencing
 * number that grows each time the lease changes hands, so a holder that lost it can tell and
 * stops writing. Global, not lab-owned: a lease covers every lab. Taken by an ordinary
 * transaction rather than a named lock, because named locks stay on one node of a Galera cluster.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('job_leases')) return;
  await knex.schema.createTable('job_leases', (t) => {
    t.string('name', 64).notNullable().primary();
    t.string('holder', 128).notNullable();
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.bigInteger('fencing').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('job_leases');
}
