import type { Knex } from 'knex';

/**
 * Personal API tokens: a member's credential for notebooks and scripts (read routes only).
 * Shown once; stored as SHA-256 of the whole token; found by its short public prefix.
 * `personal_tokens_prefix_unique` is the one index here that does not lead with tenant_id:
 * a script presents only its token, so the lookup starts from the random prefix (which
 * reveals nothing); the lab it finds must then match the URL's lab. `user_id` has no foreign key
 * (InnoDB would add an index leading with it); a token whose owner is no longer a member of the
 * lab is refused by the lab guard, which reads the membership on every request.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('personal_tokens')) return;
  await knex.schema.createTable('personal_tokens', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('user_id').unsigned().notNullable();
    t.string('name', 80).notNullable();
    t.string('prefix', 16).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.datetime('last_used_at', { precision: 3 }).nullable();
    t.datetime('revoked_at', { precision: 3 }).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['prefix'], { indexName: 'personal_tokens_prefix_unique' });
    t.index(['tenant_id', 'user_id'], 'personal_tokens_user_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('personal_tokens');
}
