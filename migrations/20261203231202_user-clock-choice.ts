import type { Knex } from 'knex';

/**
 * Which clock a person reads times on (issue #19): `logger` (readings on the logger's clock,
 * everything else on theirs; the default), `mine` (everything on their own zone) or `utc`.
 * Alert mails follow the same choice.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('users', 'clock')) return;
  await knex.schema.alterTable('users', (t) => {
    t.enu('clock', ['logger', 'mine', 'utc']).notNullable().defaultTo('logger');
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('users', 'clock'))) return;
  await knex.schema.alterTable('users', (t) => t.dropColumn('clock'));
}
