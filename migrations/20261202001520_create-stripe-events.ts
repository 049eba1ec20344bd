import type { Knex } from 'knex';

/**
 * Stripe webhook events already processed, by Stripe's event id, so a redelivered event
 * changes nothing twice. Not lab-owned (no tenant_id): an event is Stripe's, and the lab it
 * concerns is found from its payload; `tenant_id_seen` only records which lab it touched.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('stripe_events')) return;
  await knex.schema.createTable('stripe_events', (t) => {
    t.string('id', 191).notNullable().primary();
    t.string('type', 80).notNullable();
    t.bigInteger('created').notNullable();
    t.bigInteger('tenant_id_seen').unsigned().nullable();
    t.datetime('processed_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('stripe_events');
}
