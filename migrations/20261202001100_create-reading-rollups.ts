import type { Knex } from 'knex';

/**
 * Per-bucket summaries of readings (min, max, sum, count) at a few resolutions (seconds:
 * 60, 3600, 86400), kept current on ingestion, so long ranges are drawn without scanning
 * raw readings.
 */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('reading_rollups')) return;
  await knex.raw(`
    CREATE TABLE reading_rollups (
      tenant_id BIGINT UNSIGNED NOT NULL,
      channel_id BIGINT UNSIGNED NOT NULL,
      resolution_s INT UNSIGNED NOT NULL,
      bucket_start BIGINT NOT NULL,
      min_value DOUBLE NOT NULL,
      max_value DOUBLE NOT NULL,
      sum_value DOUBLE NOT NULL,
      count_value INT UNSIGNED NOT NULL,
      PRIMARY KEY (tenant_id, channel_id, resolution_s, bucket_start)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('reading_rollups');
}
