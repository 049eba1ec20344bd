import type { Knex } from 'knex';

/**
 * The record of each retention run (issue #20 item 3), kept outside any lab (no `tenant_id`):
 * when it started and finished, the readings it removed (by dropped month partitions and by
 * per-lab batches), the partitions it dropped and the last error it met. The admin's view reads
 * the latest start to say when the next removal runs; a run that never finished (the process
 * died) keeps `finished_at` null and the next run starts afresh — every step it takes is
 * complete on its own.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('retention_runs')) return;
  await knex.schema.createTable('retention_runs', (t) => {
    t.bigIncrements('id').unsigned().primary();
    t.string('holder', 128).notNullable();
    t.datetime('started_at', { precision: 3 }).notNullable();
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.bigInteger('readings_removed').unsigned().notNullable().defaultTo(0);
    t.integer('partitions_dropped').unsigned().notNullable().defaultTo(0);
    t.text('last_error').nullable();
    t.index(['started_at'], 'retention_runs_started_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('retention_runs');
}
