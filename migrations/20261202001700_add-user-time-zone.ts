import type { Knex } from 'knex';

/**
 * A person's own time zone (IANA name), optional: alert mails then give each time on the
 * reader's clock as well as on the logger's and in UTC.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('users', 'time_zone')) return;
  await knex.schema.alterTable('users', (t) => {
    t.string('time_zone', 64).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('users', 'time_zone'))) return;
  await knex.schema.alterTable('users', (t) => t.dropColumn('time_zone'));
}
