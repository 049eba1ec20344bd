import type { Knex } from 'knex';

/**
 * A person's role in a lab. Lab-owned: keyed by (tenant_id, user_id).
 * The secondary index (user_id, tenant_id) is the one index that does not lead with
 * tenant_id: it serves "which labs do I belong to", the only query that looks across labs,
 * and it only ever returns the signed-in person's own memberships.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('memberships')) return;
  await knex.schema.createTable('memberships', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('user_id').unsigned().notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.enu('role', ['admin', 'technician', 'scientist', 'guest']).notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id', 'user_id']);
    t.index(['user_id', 'tenant_id'], 'memberships_user_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('memberships');
}
