import type { Knex } from 'knex';

/**
 * The finest rollup level a channel keeps, in seconds (NULL: none at all). Levels no coarser
 * than the channel's reporting interval hold a row per reading and are not kept (see
 * server/db/rollup-levels.ts); readers use a level only at or above this one and read raw
 * readings otherwise. Filled by the next migration; channels.repo.ts sets it for each new
 * channel. A row written without it (a script, a test fixture) gets 60, every level: the old
 * behaviour, never a wrong answer, only larger until the channel's interval is next edited.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('channels', 'finest_rollup_s')) return;
  await knex.schema.alterTable('channels', (t) => {
    t.integer('finest_rollup_s').unsigned().nullable().defaultTo(60);
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('channels', 'finest_rollup_s'))) return;
  await knex.schema.alterTable('channels', (t) => t.dropColumn('finest_rollup_s'));
}
