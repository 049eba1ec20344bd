import type { Knex } from 'knex';

/**
 * The kinds a lab sorts its notes by (maintenance, calibration …): a lab's own list, which
 * starts as Lagbook's short default list the first time the lab's notes are used. A kind is
 * renamed or retired, never deleted, so an old note always keeps its kind; a retired kind
 * (`retired_at` set) is not offered for new notes. Names are unique within a lab.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('note_kinds')) return;
  await knex.schema.createTable('note_kinds', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.string('name', 40).notNullable();
    t.integer('position').unsigned().notNullable().defaultTo(0);
    t.datetime('retired_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'name'], { indexName: 'note_kinds_name_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('note_kinds');
}
