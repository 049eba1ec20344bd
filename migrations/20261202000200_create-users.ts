import type { Knex } from 'knex';

/**
 * People, as the identity provider knows them. A user is global (one person may belong to
 * several labs); identity is the pair (issuer, subject), never the e-mail address, which
 * can change at the provider.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('users')) return;
  await knex.schema.createTable('users', (t) => {
    t.bigIncrements('id').unsigned().primary();
    t.string('oidc_issuer', 191).notNullable();
    t.string('oidc_subject', 191).notNullable();
    t.string('email', 191).notNullable();
    t.boolean('email_verified').notNullable().defaultTo(false);
    t.string('display_name', 191).notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('last_sign_in_at', { precision: 3 }).nullable();
    t.unique(['oidc_issuer', 'oidc_subject'], { indexName: 'users_identity_unique' });
    t.index(['email'], 'users_email_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('users');
}
