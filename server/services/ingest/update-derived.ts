import type { LabScope } from '../../db/tenant-scope.ts';
import { readingsRepo } from '../../db/readings.repo.ts';
import { channelStateRepo } from '../../db/channel-state.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import type { ReadingSource } from '../../db/quarantine.repo.ts';
import type { SortedCandidates } from './batch-candidates.ts';

/** The batch whose readings were just stored, as the derived data needs it. */
export interface StoredReadings {
  loggerId: number;
  source: ReadingSource;
  /** The batch's candidates, as given to `storeNew`. */
  sorted: SortedCandidates;
  /** How many of them `storeNew` wrote. */
  accepted: number;
}

/**
 * Brings what is derived from the readings up to date after a batch stored new ones, on the
 * scope's transaction so it commits or rolls back with them: the rollups of the touched buckets
 * (folded in when every candidate was new, recomputed from the stored rows otherwise), each
 * channel's latest reading, data version and stored-readings counter (see
 * `channelStateRepo(...).advance` and `storeNew`), and, for a batch the logger sent itself,
 * the logger's last-seen time (read from `now` at that moment).
 */
export async function updateDerived(scope: LabScope, batch: StoredReadings, now: () => number): Promise<void> {
  const { columns, runs } = batch.sorted;
  if (batch.accepted > 0) {
    const readings = readingsRepo(scope);
    if (batch.accepted === columns.length) {
      // every candidate is a new row: fold them into their buckets without rescanning readings
      await readings.addToRollups(columns);
    } else {
      // some rows were already stored: recompute the touched buckets from what is stored
      await readings.refreshRollups(
        runs.map((r) => r.channelId),
        Array.from(columns.ts),
      );
    }
    // Each channel's run ends with its latest time. A channel whose rows were all duplicates
    // still gets a version bump when another channel of the batch stored something (a spare
    // cache miss, never a stale answer). When every candidate was new, each channel gained its
    // run's length, counted here in the same statement; otherwise `storeNew` already counted
    // each channel's new rows exactly (it knows them run by run), so nothing is added twice.
    const allNew = batch.accepted === columns.length;
    await channelStateRepo(scope).advance(runs.map((r) => ({ channelId: r.channelId, ts: columns.ts[r.to - 1], added: allNew ? r.to - r.from : 0 })));
  }
  if (batch.source === 'api') await loggersRepo(scope).markSeen(batch.loggerId, now());
}
