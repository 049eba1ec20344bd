import type { Knex } from 'knex';

/**
 * One row per lab that has touched billing: its plan as Stripe last confirmed it, the
 * subscription status and grace period, the stored-readings counter (bumped on ingestion,
 * reconciled by the usage job) and the highest usage warning already mailed. A lab without a
 * row is on the free plan with nothing counted yet.
 * `lab_billing_customer_unique` is the one index here that does not lead with tenant_id: a
 * Stripe webhook names only the customer, so that lookup starts without a lab.
 * `state_at` is the Stripe `created` time (Unix seconds) of the newest event applied, so an
 * older event arriving late never rolls the state back.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('lab_billing')) return;
  await knex.schema.createTable('lab_billing', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.string('plan_key', 40).notNullable();
    t.string('status', 16).notNullable().defaultTo('none');
    t.string('stripe_customer_id', 191).nullable();
    t.string('stripe_subscription_id', 191).nullable();
    t.datetime('grace_until', { precision: 3 }).nullable();
    t.bigInteger('state_at').notNullable().defaultTo(0);
    t.bigInteger('readings_count').unsigned().notNullable().defaultTo(0);
    t.datetime('reconciled_at', { precision: 3 }).nullable();
    t.smallint('warned_percent').unsigned().notNullable().defaultTo(0);
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(['tenant_id']);
    t.unique(['stripe_customer_id'], { indexName: 'lab_billing_customer_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('lab_billing');
}
