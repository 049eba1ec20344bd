import type { Knex } from 'knex';

/** Rows removed per statement: bounded, so no statement holds many locks or much undo. */
const BATCH = 10_000;
const LEVELS = [60, 3600, 86400];

/** Channels that keep fewer than every level, with their finest kept level (null: none). */
async function channelsWithDroppedLevels(knex: Knex): Promise<Array<{ tenantId: number; channelId: number; floor: number | null }>> {
  const rows: Array<{ tenantId: number; channelId: number; floor: number | null }> = await knex('channels')
    .where((q) => q.whereNull('finest_rollup_s').orWhere('finest_rollup_s', '>', LEVELS[0]))
    .orderBy(['tenant_id', 'id'])
    .select('tenant_id as tenantId', 'id as channelId', 'finest_rollup_s as floor');
  return rows.map((r) => ({ tenantId: Number(r.tenantId), channelId: Number(r.channelId), floor: r.floor === null ? null : Number(r.floor) }));
}

/**
 * Removes the rollup rows of levels finer than each channel's finest kept level (set by the
 * previous migration): the minute level of channels reporting every minute or slower, and so
 * on. Each statement deletes at most 10,000 rows along the primary key (tenant, channel,
 * resolution, bucket), so the run never becomes one huge transaction. Rerunnable: a run cut
 * short leaves only rows no reader uses, and the next run removes the rest.
 */
export async function up(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('channels', 'finest_rollup_s'))) return;
  for (const c of await channelsWithDroppedLevels(knex)) {
    const below = c.floor ?? Number.MAX_SAFE_INTEGER;
    for (;;) {
      const [result] = await knex.raw(
        'DELETE FROM reading_rollups WHERE tenant_id = ? AND channel_id = ? AND resolution_s < ? ORDER BY resolution_s, bucket_start LIMIT ?',
        [c.tenantId, c.channelId, below, BATCH],
      );
      if (Number((result as { affectedRows: number }).affectedRows) < BATCH) break;
    }
  }
}

/**
 * Rebuilds the removed levels from the raw readings (each from the readings themselves, which is
 * what the rows held: min, max, sum and count of the readings in the bucket).
 */
export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('channels', 'finest_rollup_s'))) return;
  for (const c of await channelsWithDroppedLevels(knex)) {
    for (const res of LEVELS.filter((r) => c.floor === null || r < c.floor)) {
      await knex.raw(
        `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
         SELECT tenant_id, channel_id, ?, ts - MOD(ts, ?) AS b, MIN(value), MAX(value), SUM(value), COUNT(*)
         FROM readings WHERE tenant_id = ? AND channel_id = ? GROUP BY channel_id, b
         ON DUPLICATE KEY UPDATE min_value = VALUES(min_value), max_value = VALUES(max_value), sum_value = VALUES(sum_value), count_value = VALUES(count_value)`,
        [res, res * 1000, c.tenantId, c.channelId],
      );
    }
  }
}
