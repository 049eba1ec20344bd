import type { Knex } from 'knex';

/**
 * Rows that could not be stored, with the reason, exactly as they arrived: nothing a logger
 * or a person sends is silently dropped. Reviewed, fixed and re-submitted, or discarded,
 * from the quarantine page.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('quarantined_rows')) return;
  await knex.schema.createTable('quarantined_rows', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('logger_id').unsigned().nullable();
    t.string('source', 16).notNullable();
    t.string('batch_ref', 64).nullable();
    t.integer('row_index').unsigned().notNullable();
    t.string('reason_code', 48).notNullable();
    t.string('reason', 255).notNullable();
    t.string('channel_key', 191).nullable();
    t.string('ts_raw', 191).nullable();
    t.string('value_raw', 191).nullable();
    t.text('raw').nullable();
    t.datetime('received_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id', 'id']);
    t.index(['tenant_id', 'logger_id', 'received_at'], 'quarantine_logger_index');
    t.index(['tenant_id', 'reason_code', 'received_at'], 'quarantine_reason_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('quarantined_rows');
}
