import type { Knex } from 'knex';

/**
 * Browser sessions, kept in MariaDB so that any number of stateless app servers can serve
 * the same person. Shape expected by connect-session-knex (sid, sess, expired).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('sessions')) return;
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 191).primary();
    t.json('sess').notNullable();
    t.datetime('expired').notNullable().index('sessions_expired_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sessions');
}
