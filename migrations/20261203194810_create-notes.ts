import type { Knex } from 'knex';

/**
 * Notes on time ranges: why data of a channel (or of every channel of a logger, when
 * `channel_id` is null) looks as it does between `start_ts` (inclusive) and `end_ts`
 * (exclusive), both epoch ms like readings. `exclude_from_analysis` asks diagnostics and the
 * unusual-reading alert fits to leave the span's readings out. Logger, channel, kind and people
 * carry no foreign key (InnoDB would add indexes not led by tenant_id); the service checks them
 * in the lab. The two indexes serve "notes of a channel or its logger overlapping a range".
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('notes')) return;
  await knex.schema.createTable('notes', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('logger_id').unsigned().notNullable();
    t.bigInteger('channel_id').unsigned().nullable();
    t.bigInteger('kind_id').unsigned().notNullable();
    t.text('body').notNullable();
    t.bigInteger('start_ts').notNullable();
    t.bigInteger('end_ts').notNullable();
    t.boolean('exclude_from_analysis').notNullable().defaultTo(false);
    t.bigInteger('created_by').unsigned().nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.bigInteger('updated_by').unsigned().nullable();
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id', 'id']);
    t.index(['tenant_id', 'logger_id', 'start_ts'], 'notes_logger_index');
    t.index(['tenant_id', 'channel_id', 'start_ts'], 'notes_channel_index');
    t.index(['tenant_id', 'kind_id'], 'notes_kind_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('notes');
}
