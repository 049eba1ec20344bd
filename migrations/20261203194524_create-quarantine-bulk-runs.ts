import type { Knex } from 'knex';

/**
 * Bulk repairs of a lab's quarantine (re-read times, shift times, map a channel, discard): one
 * row per run with its progress and outcome, so the page can follow a run of thousands of rows
 * that works in the background. `running_slot` is 1 while the run works and NULL once it ended:
 * the unique key on `(tenant_id, running_slot)` lets a lab have one running run at a time
 * (NULLs do not collide), whatever the number of servers.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('quarantine_bulk_runs')) return;
  await knex.schema.createTable('quarantine_bulk_runs', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.string('state', 16).notNullable();
    t.tinyint('running_slot').unsigned().nullable();
    t.string('action', 16).notNullable();
    t.text('request').notNullable();
    t.bigInteger('started_by').unsigned().nullable();
    t.string('started_by_name', 191).nullable();
    t.integer('total').unsigned().notNullable().defaultTo(0);
    t.integer('done').unsigned().notNullable().defaultTo(0);
    t.text('outcome').nullable();
    t.string('error', 500).nullable();
    t.datetime('started_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('heartbeat_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'running_slot'], { indexName: 'quarantine_bulk_runs_one_running' });
    t.index(['tenant_id', 'started_at'], 'quarantine_bulk_runs_recent');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('quarantine_bulk_runs');
}
