import type { Knex } from 'knex';

/**
 * The storage maintenance job's record of each closed month it rebuilds (issue #20 item 2): one
 * row per (table, month), status `copying` (rows go into a page-compressed staging table in key
 * order) → `swapped` (the staging table has been exchanged with the month's partition; the rows
 * that arrived during the copy are being put back) → `done`. `staging_space_id` is the InnoDB
 * tablespace of the staging copy, written before the swap: after a crash the job compares it with
 * the partition's tablespace to know whether the swap happened. Not lab-owned (no tenant_id): it
 * describes storage, not any lab's data.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('storage_rebuilds')) return;
  await knex.schema.createTable('storage_rebuilds', (t) => {
    t.string('table_name', 64).notNullable();
    t.bigInteger('month_start').notNullable();
    t.string('partition_name', 16).notNullable();
    t.enu('status', ['copying', 'swapped', 'done']).notNullable();
    t.bigInteger('rows_copied').unsigned().notNullable().defaultTo(0);
    t.bigInteger('rows_put_back').unsigned().notNullable().defaultTo(0);
    t.bigInteger('staging_space_id').unsigned().nullable();
    t.datetime('started_at', { precision: 3 }).notNullable();
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.string('last_error', 1000).nullable();
    t.primary(['table_name', 'month_start']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('storage_rebuilds');
}
