import type { Knex } from 'knex';

/**
 * Channels of a logger (one measured quantity each). `channel_key` is what the logger sends
 * in each reading; unique per logger. The valid range marks out-of-range readings (they are
 * stored, and flagged, never dropped).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('channels')) return;
  await knex.schema.createTable('channels', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('logger_id').unsigned().notNullable();
    t.string('channel_key', 64).notNullable();
    t.string('label', 120).notNullable();
    t.string('unit', 32).notNullable().defaultTo('');
    t.string('quantity', 64).notNullable().defaultTo('');
    t.double('valid_min').nullable();
    t.double('valid_max').nullable();
    t.integer('expected_interval_s').unsigned().nullable();
    t.integer('seasonal_period_hint').unsigned().nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('retired_at', { precision: 3 }).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'logger_id', 'channel_key'], { indexName: 'channels_key_unique' });
    t.foreign(['tenant_id', 'logger_id'], 'channels_logger_fk').references(['tenant_id', 'id']).inTable('loggers').onDelete('CASCADE');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('channels');
}
