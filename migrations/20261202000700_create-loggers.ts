import type { Knex } from 'knex';

/** Data loggers of a lab. Retired loggers keep their history (retired_at set, nothing deleted). */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('loggers')) return;
  await knex.schema.createTable('loggers', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.string('name', 120).notNullable();
    t.string('serial', 120).nullable();
    t.string('site', 120).nullable();
    t.string('timezone', 64).notNullable().defaultTo('UTC');
    t.integer('expected_interval_s').unsigned().notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('retired_at', { precision: 3 }).nullable();
    t.bigInteger('last_seen_at').nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'name'], { indexName: 'loggers_name_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('loggers');
}
