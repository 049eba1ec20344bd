import type { Knex } from 'knex';

/**
 * Fills `channels.stored_readings` with each channel's exact count of rows in `readings`, one
 * channel per statement (a short transaction each, however large the lab). The count is made in
 * the UPDATE itself: the subquery's locking read holds the channel's readings until the row is
 * written, so a batch stored meanwhile by a server that already keeps the counter either lands
 * before the count (and is in it) or waits and adds itself after. Rerunning it recounts, so a
 * half-run backfill is simply run again.
 */
export async function up(knex: Knex): Promise<void> {
  const channels: Array<{ tenantId: number; id: number }> = await knex('channels').orderBy(['tenant_id', 'id']).select('tenant_id as tenantId', 'id');
  for (const c of channels) {
    await knex.raw(
      'UPDATE channels SET stored_readings = (SELECT COUNT(*) FROM readings WHERE readings.tenant_id = ? AND readings.channel_id = ?) WHERE tenant_id = ? AND id = ?',
      [c.tenantId, c.id, c.tenantId, c.id],
    );
  }
}

/** Nothing to undo: the column itself goes with the previous migration's `down`. */
export async function down(): Promise<void> {}
