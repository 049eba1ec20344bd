import type { Knex } from 'knex';

/**
 * Pending and past invitations to a lab. The link's secret is stored only as its SHA-256
 * hash; the link carries the lab's slug, so the lookup stays inside one lab
 * (unique (tenant_id, token_hash)). Ids are random 48-bit integers made by the data layer,
 * so the primary key can lead with tenant_id without an AUTO_INCREMENT column.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('invitations')) return;
  await knex.schema.createTable('invitations', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.string('email', 191).notNullable();
    t.enu('role', ['admin', 'technician', 'scientist', 'guest']).notNullable();
    t.specificType('token_hash', 'CHAR(64)').notNullable();
    t.bigInteger('invited_by_user_id').unsigned().nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('last_sent_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.datetime('accepted_at', { precision: 3 }).nullable();
    t.bigInteger('accepted_by_user_id').unsigned().nullable();
    t.datetime('revoked_at', { precision: 3 }).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'token_hash'], { indexName: 'invitations_token_unique' });
    t.index(['tenant_id', 'email'], 'invitations_email_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('invitations');
}
