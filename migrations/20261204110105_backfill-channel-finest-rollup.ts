import type { Knex } from 'knex';

/**
 * Sets every channel's finest kept rollup level from its reporting interval (its own, else its
 * logger's): the finest of 60, 3600, 86400 s strictly coarser than the interval, NULL when none
 * is (the rule of server/db/rollup-levels.ts, written out here so this migration never changes
 * with the code). Every level exists in full for every channel before this runs, so any floor
 * chosen is readable at once. Idempotent: rerunning sets the same values.
 */
export async function up(knex: Knex): Promise<void> {
  const interval = 'COALESCE(channels.expected_interval_s, loggers.expected_interval_s)';
  await knex.raw(
    `UPDATE channels JOIN loggers ON loggers.tenant_id = channels.tenant_id AND loggers.id = channels.logger_id
     SET channels.finest_rollup_s = CASE WHEN ${interval} < 60 THEN 60 WHEN ${interval} < 3600 THEN 3600 WHEN ${interval} < 86400 THEN 86400 ELSE NULL END`,
  );
}

/** Nothing to undo: the column itself goes with the previous migration's `down`. */
export async function down(): Promise<void> {}
