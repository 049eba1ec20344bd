import type { Knex } from 'knex';

/**
 * Alerts: one row per time a rule opened, with what opened it and (later) what resolved it,
 * reminders sent and the acknowledgement. The rule's name and kind are copied in, so history
 * reads the same after a rule changes or goes. `open_rule_id` holds the rule's id while the
 * alert is open and NULL after: its unique key lets a rule have at most one open alert even
 * when two evaluators race (NULLs do not collide). Times of readings are epoch ms, as in readings.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('alerts')) return;
  await knex.schema.createTable('alerts', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('rule_id').unsigned().notNullable();
    t.bigInteger('open_rule_id').unsigned().nullable();
    t.string('rule_name', 80).notNullable();
    t.string('kind', 16).notNullable();
    t.bigInteger('channel_id').unsigned().nullable();
    t.bigInteger('logger_id').unsigned().nullable();
    t.bigInteger('opened_at').notNullable();
    t.double('opened_value').nullable();
    t.string('opened_detail', 255).notNullable();
    t.bigInteger('resolved_at').nullable();
    t.double('resolved_value').nullable();
    t.string('resolved_detail', 255).nullable();
    t.integer('reminders_sent').unsigned().notNullable().defaultTo(0);
    t.bigInteger('last_notified_at').notNullable();
    t.datetime('acknowledged_at', { precision: 3 }).nullable();
    t.bigInteger('acknowledged_by').unsigned().nullable();
    t.string('acknowledgement_note', 500).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'open_rule_id'], { indexName: 'alerts_one_open_per_rule' });
    t.index(['tenant_id', 'rule_id', 'opened_at'], 'alerts_rule_index');
    t.index(['tenant_id', 'channel_id', 'opened_at'], 'alerts_channel_index');
    t.index(['tenant_id', 'opened_at'], 'alerts_opened_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('alerts');
}
