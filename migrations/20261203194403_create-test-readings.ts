import type { Knex } from 'knex';

/**
 * Test readings sent by hand from a logger's page, kept apart from `readings` (which stays four
 * lean columns): the channel, time and value, who sent it and when (epoch ms on the service
 * clock, for the sender's 10-minute removal window), and whether the value lay outside the
 * channel's valid range (stored only after the sender confirmed it). Because they are not in
 * `readings`, rollups, diagnostics, usage and alerts never see them.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('test_readings')) return;
  await knex.schema.createTable('test_readings', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.bigInteger('id').unsigned().notNullable();
    t.bigInteger('logger_id').unsigned().notNullable();
    t.bigInteger('channel_id').unsigned().notNullable();
    t.bigInteger('ts').notNullable();
    t.double('value').notNullable();
    // no foreign key: like audit_events.actor_user_id, the row outlives the account
    t.bigInteger('sent_by').unsigned().nullable();
    t.bigInteger('sent_at').notNullable();
    t.boolean('outside_range').notNullable().defaultTo(false);
    t.primary(['tenant_id', 'id']);
    t.index(['tenant_id', 'channel_id', 'ts'], 'test_readings_channel_index');
    t.index(['tenant_id', 'logger_id', 'sent_at'], 'test_readings_logger_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('test_readings');
}
