import type { Knex } from 'knex';

/**
 * One row per cycle of a scheduled cluster-wide job (first the alert evaluator): the cycle's
 * start (the run's time floored to the job's interval), who ran it under which lease fencing
 * number, and when it started and finished. The primary key (name, period_start) makes a cycle
 * claimable once however many app servers tick in it: the claim is an INSERT in the transaction
 * that holds the job's lease, and a second claim of the same cycle finds the row (or, on another
 * Galera node, fails certification). Global, not lab-owned. Rows older than seven days are
 * pruned by the job itself.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('job_runs')) return;
  await knex.schema.createTable('job_runs', (t) => {
    t.string('name', 64).notNullable();
    t.datetime('period_start', { precision: 3 }).notNullable();
    t.string('holder', 128).notNullable();
    t.bigInteger('fencing').unsigned().notNullable();
    t.datetime('started_at', { precision: 3 }).notNullable();
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.primary(['name', 'period_start']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('job_runs');
}
