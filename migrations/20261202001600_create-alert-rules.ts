import type { Knex } from 'knex';

/**
 * Alert rules of a lab: what to watch (a channel, or for silence a whole logger), which kind
 * of rule with its parameters (JSON, validated by the API's schema), and the rule's memory
 * between evaluations — the newest reading already judged (`cursor_ts`), when a breach began
 * (`pending_since_ts`, for hold times) and the previous reading (for rates) — so an evaluator
 * that restarts neither forgets a pending hold nor judges a reading twice. Channel, logger and
 * creator carry no foreign key (InnoDB would add indexes not led by tenant_id); the service
 * checks them in the lab, and deleting a channel is not possible (channels retire).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('alert_rules')) return;
  await knex.schema.createTable('alert_rules', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.string('name', 80).notNullable();
    t.string('kind', 16).notNullable();
    t.bigInteger('channel_id').unsigned().nullable();
    t.bigInteger('logger_id').unsigned().nullable();
    t.text('params').notNullable();
    t.integer('reminder_after_min').unsigned().nullable();
    t.boolean('enabled').notNullable().defaultTo(true);
    t.bigInteger('created_by').unsigned().nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.bigInteger('watching_since').notNullable();
    t.bigInteger('cursor_ts').nullable();
    t.bigInteger('pending_since_ts').nullable();
    t.bigInteger('previous_ts').nullable();
    t.double('previous_value').nullable();
    t.primary(['tenant_id', 'id']);
    t.index(['tenant_id', 'channel_id'], 'alert_rules_channel_index');
    t.index(['tenant_id', 'logger_id'], 'alert_rules_logger_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('alert_rules');
}
