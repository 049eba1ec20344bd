import type { Knex } from 'knex';

/**
 * Alert mail waiting to go out: one row per (alert, subscriber, kind, reminder number), written
 * in the same transaction as the alert's change, so a crash never loses a notification and its
 * unique key never doubles one. The sender claims a row (`claimed_until`), sends it and marks
 * `sent_at`; a failed send is retried at `next_attempt_at` with back-off. The rendered message
 * is stored, so it shows the reading and rule as they were when the alert changed.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('notification_outbox')) return;
  await knex.schema.createTable('notification_outbox', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('alert_id').unsigned().notNullable();
    t.bigInteger('user_id').unsigned().notNullable();
    t.string('kind', 16).notNullable();
    t.integer('sequence').unsigned().notNullable().defaultTo(0);
    t.string('to_address', 191).notNullable();
    t.string('subject', 255).notNullable();
    t.text('body_text').notNullable();
    t.text('body_html').notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('attempts').unsigned().notNullable().defaultTo(0);
    t.bigInteger('next_attempt_at').notNullable();
    t.bigInteger('claimed_until').nullable();
    t.bigInteger('sent_at').nullable();
    t.string('last_error', 255).nullable();
    t.primary(['tenant_id', 'id']);
    t.unique(['tenant_id', 'alert_id', 'user_id', 'kind', 'sequence'], { indexName: 'notification_outbox_once' });
    t.index(['tenant_id', 'sent_at', 'next_attempt_at'], 'notification_outbox_due_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('notification_outbox');
}
