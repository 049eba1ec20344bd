import type { Knex } from 'knex';

/**
 * Who is mailed about a rule's alerts: one row per (rule, member). The rule's creator is
 * subscribed when the rule is made; others subscribe themselves. Rows go with their rule.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('alert_subscriptions')) return;
  await knex.schema.createTable('alert_subscriptions', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('rule_id').unsigned().notNullable();
    t.bigInteger('user_id').unsigned().notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id', 'rule_id', 'user_id']);
    t.index(['tenant_id', 'user_id'], 'alert_subscriptions_user_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('alert_subscriptions');
}
