import type { Knex } from 'knex';

/**
 * Readings: (tenant_id, channel_id, ts, value), ts in UTC epoch milliseconds. The primary
 * key makes a re-sent reading a duplicate, never a second row, and keeps each channel's
 * readings together in time order (range scans for charts and diagnostics).
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('readings')) return;
  await knex.raw(`
    CREATE TABLE readings (
      tenant_id BIGINT UNSIGNED NOT NULL,
      channel_id BIGINT UNSIGNED NOT NULL,
      ts BIGINT NOT NULL,
      value DOUBLE NOT NULL,
      PRIMARY KEY (tenant_id, channel_id, ts)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('readings');
}
