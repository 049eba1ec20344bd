import type { Knex } from 'knex';

/**
 * The lab's audit log: who did what, when. Append-only; read newest first, filtered by
 * action and time (both indexes lead with tenant_id).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('audit_events')) return;
  await knex.schema.createTable('audit_events', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.datetime('at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.bigInteger('actor_user_id').unsigned().nullable();
    t.string('action', 64).notNullable();
    t.string('target_type', 32).nullable();
    t.string('target_id', 64).nullable();
    t.string('summary', 255).notNullable();
    t.json('details').nullable();
    t.primary(['tenant_id', 'id']);
    t.index(['tenant_id', 'at'], 'audit_events_time_index');
    t.index(['tenant_id', 'action', 'at'], 'audit_events_action_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('audit_events');
}
