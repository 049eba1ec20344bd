import type { Knex } from 'knex';

/**
 * The journal of month partitions the retention job drops (issue #20 item 3), kept outside any
 * lab. `DROP PARTITION` commits on its own, so it cannot share a transaction with the
 * per-channel stored-readings counters it must lower. The job therefore writes this row first,
 * with the rows per (lab, channel) counted in the partition (`channel_rows`, JSON), then drops the
 * readings and rollups partitions, then lowers the counters and sets `settled_at` in one
 * transaction. A run that dies in between leaves `settled_at` null; the next run finds the row:
 * the readings partition gone → lower the counters now; still there → count again and decide
 * afresh (`cancelled_at` when the month may no longer go).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('retention_partition_drops')) return;
  await knex.schema.createTable('retention_partition_drops', (t) => {
    t.bigIncrements('id').unsigned().primary();
    t.bigInteger('run_id').unsigned().notNullable();
    t.string('partition_name', 64).notNullable();
    t.bigInteger('month_end').notNullable();
    t.text('channel_rows', 'mediumtext').notNullable();
    t.bigInteger('readings').unsigned().notNullable();
    t.datetime('journaled_at', { precision: 3 }).notNullable();
    t.datetime('settled_at', { precision: 3 }).nullable();
    t.datetime('cancelled_at', { precision: 3 }).nullable();
    t.index(['settled_at', 'cancelled_at'], 'retention_partition_drops_open_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('retention_partition_drops');
}
