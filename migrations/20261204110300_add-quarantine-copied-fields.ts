import type { Knex } from 'knex';

/**
 * Where a quarantined row's time and value as received sit in its original text (`raw`), so
 * they are not stored a second time (see server/db/quarantine-copies.ts): low 4 bits the time's
 * source, high 4 bits the value's; 0 = its own column (every existing row, until the next
 * migration converts them).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('quarantined_rows', 'copied_fields')) return;
  await knex.schema.alterTable('quarantined_rows', (t) => {
    t.tinyint('copied_fields').unsigned().notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('quarantined_rows', 'copied_fields'))) return;
  await knex.schema.alterTable('quarantined_rows', (t) => t.dropColumn('copied_fields'));
}
