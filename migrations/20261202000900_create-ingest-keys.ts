import type { Knex } from 'knex';

/**
 * Ingest keys: a logger's credential. Shown once; stored as SHA-256 of the whole key; found
 * by its short public prefix. `ingest_keys_prefix_unique` is the one index here that does
 * not lead with tenant_id: a logger presents only its key, so the lookup must start without
 * a lab, and the prefix reveals nothing (it is random).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('ingest_keys')) return;
  await knex.schema.createTable('ingest_keys', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('logger_id').unsigned().notNullable();
    t.string('prefix', 16).notNullable();
    t.specificType('key_hash', 'CHAR(64)').notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.bigInteger('created_by_user_id').unsigned().nullable();
    t.datetime('last_used_at', { precision: 3 }).nullable();
    t.datetime('revoked_at', { precision: 3 }).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['prefix'], { indexName: 'ingest_keys_prefix_unique' });
    t.index(['tenant_id', 'logger_id'], 'ingest_keys_logger_index');
    t.foreign(['tenant_id', 'logger_id'], 'ingest_keys_logger_fk').references(['tenant_id', 'id']).inTable('loggers').onDelete('CASCADE');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('ingest_keys');
}
