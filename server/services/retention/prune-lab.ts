import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { retentionLabRepo } from '../../db/retention.repo.ts';

/** Readings (and rollup rows per resolution) removed by one statement at most. */
export const PRUNE_BATCH_ROWS = 10_000;

/**
 * Removes one lab's readings before `beforeMs`, channel by channel, in bounded batches: each
 * batch is one transaction that deletes at most `batchRows` of the channel's oldest readings
 * before the horizon (a key range: lab, channel, time), at most `batchRows` rollup rows per
 * resolution whose whole bucket ends at or before it, and lowers the channel's and the lab's
 * stored-readings counters by the readings deleted. A crash loses at most the batch in flight,
 * which rolls back whole; the next run starts again where the data now begins.
 *
 * `beforeMs` is a UTC day start (see removalHorizon), so no minute, hour or day bucket
 * straddles it: rollups before it go whole, the ones after it are untouched and stay exact.
 * `beforeEachBatch` lets the job renew its lease (it throws when the lease is lost, and the
 * pruning stops before writing anything more). Returns the readings removed.
 */
export async function pruneLab(
  db: Db,
  labId: number,
  beforeMs: number,
  opts: { batchRows?: number; beforeEachBatch?: () => Promise<void> } = {},
): Promise<number> {
  if (!Number.isSafeInteger(beforeMs)) throw new Error(`pruneLab: the horizon must be a whole number of epoch ms (got ${beforeMs})`);
  const batch = opts.batchRows ?? PRUNE_BATCH_ROWS;
  const beforeEachBatch = opts.beforeEachBatch ?? (async () => {});
  let removed = 0;
  for (const channelId of await retentionLabRepo(inLab(db, labId)).channelIds()) {
    const resolutions = await retentionLabRepo(inLab(db, labId)).rollupResolutions(channelId);
    for (;;) {
      await beforeEachBatch();
      const { readings, rollupsFull } = await db.transaction(
        async (trx) => {
          const repo = retentionLabRepo(inLab(trx, labId));
          const n = await repo.deleteReadingsBefore(channelId, beforeMs, batch);
          let full = false;
          for (const res of resolutions) if ((await repo.deleteRollupsBefore(channelId, res, beforeMs, batch)) >= batch) full = true;
          await repo.lowerChannelCount(channelId, n);
          await repo.lowerLabCount(n);
          return { readings: n, rollupsFull: full };
        },
        // READ COMMITTED: the range delete locks the rows it removes, not the gaps around them, so a
        // logger storing new readings of the channel is never held up by it. Locks are taken in
        // ingestion's order (readings, rollups, channel row, the lab's billing row): no deadlock cycle.
        { isolationLevel: 'read committed' },
      );
      removed += readings;
      if (readings < batch && !rollupsFull) break;
    }
  }
  return removed;
}
