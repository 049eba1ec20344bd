import type { Knex } from 'knex';

/**
 * The record of each lab deletion, kept outside the lab (no `tenant_id`, no foreign key to
 * `labs`: it outlives the lab row). Who asked (id, name and address copied, so the record
 * survives the person's account), when, the lab's id, name and address, the Stripe
 * subscription cancelled, the rows removed per table (JSON, counted by the deletion job as it
 * goes) and when the job finished (null while rows remain). `ready_at` is set once the
 * request has cancelled the subscription: the job removes rows only from then on, so a request
 * that fails at Stripe can still reopen the lab untouched. The job resumes from this row after a
 * crash: `ready_at IS NOT NULL AND finished_at IS NULL` is its work list.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('lab_deletions')) return;
  await knex.schema.createTable('lab_deletions', (t) => {
    t.bigIncrements('id').unsigned().primary();
    t.bigInteger('lab_id').unsigned().notNullable();
    t.string('lab_slug', 64).notNullable();
    t.string('lab_name', 120).notNullable();
    t.bigInteger('requested_by_user_id').unsigned().nullable();
    t.string('requested_by_name', 200).notNullable();
    t.string('requested_by_email', 320).notNullable();
    t.datetime('requested_at', { precision: 3 }).notNullable();
    t.string('stripe_subscription_id', 191).nullable();
    t.datetime('ready_at', { precision: 3 }).nullable();
    t.text('rows_removed').notNullable();
    t.datetime('finished_at', { precision: 3 }).nullable();
    t.text('last_error').nullable();
    t.index(['finished_at'], 'lab_deletions_pending_index');
    t.index(['lab_id'], 'lab_deletions_lab_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('lab_deletions');
}
