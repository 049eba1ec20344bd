import type { Knex } from 'knex';

/**
 * A counter on each lease row that every fenced transaction raises (`job-leases.repo.ts`,
 * `fence`): the conditional update that proves "this holder still holds the lease with this
 * fencing number" must really change the row, because MariaDB skips a row an UPDATE leaves as it
 * was, and under Galera an unchanged row is not part of the write set, so a takeover committed on
 * another node would not make the stale holder's commit fail certification.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('job_leases', 'fenced_writes')) return;
  await knex.schema.alterTable('job_leases', (t) => {
    t.bigInteger('fenced_writes').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('job_leases', 'fenced_writes'))) return;
  await knex.schema.alterTable('job_leases', (t) => {
    t.dropColumn('fenced_writes');
  });
}
