import type { Db } from '../db/create-db.ts';
import { inLab, type LabScope } from '../db/tenant-scope.ts';
import { keptLevels } from '../db/rollup-levels.ts';
import { rollupLevelsRepo, type ChannelLevels } from '../db/rollup-levels.repo.ts';

/** Which channels an interval edit touched: one channel, or every channel of one logger. */
export type IntervalEditTarget = { channelIds: number[] } | { loggerId: number };

/** What settling one channel did. */
export interface SettledChannel {
  channelId: number;
  /** The floor stored before and after (null: no rollups at all). */
  from: number | null;
  to: number | null;
  /** Levels built from raw readings (finer floor), finest first. */
  built: number[];
  /** Rollup rows removed (coarser floor, or rows left below the floor by an interrupted run). */
  removed: number;
}

/** The UTC month starts from the month holding `first` up to the one after the month holding `last`. */
export function monthBounds(first: number, last: number): number[] {
  const d = new Date(first);
  const bounds = [Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), 1)];
  while (bounds[bounds.length - 1] <= last) {
    const m = new Date(bounds[bounds.length - 1]);
    bounds.push(Date.UTC(m.getUTCFullYear(), m.getUTCMonth() + 1, 1));
  }
  return bounds;
}

/**
 * Inside the transaction that changes a reporting interval: raises the stored floor of every
 * channel whose interval now calls for fewer rollup levels, so readers stop using the dropped
 * levels as the edit commits. Their rows, and any level a shorter interval now calls for, are
 * handled by `settle` after the commit.
 */
export async function raiseFloorsOnEdit(scope: LabScope, target: IntervalEditTarget): Promise<void> {
  await rollupLevelsRepo(scope).raiseFloors(target);
}

/**
 * Keeps each channel's rollup levels in step with its reporting interval after an edit.
 * - Coarser interval: the floor was raised in the edit's transaction (`raiseFloorsOnEdit`); the
 *   dropped levels' rows are deleted here in bounded batches.
 * - Finer interval: writers already feed the newly kept levels (they follow the interval, see
 *   readings.repo.ts); here each new level is built from the raw readings over the channel's
 *   whole history, one UTC month per statement, and only then is the floor lowered, so a reader
 *   never sees a partly built level.
 * Rerunnable: a run cut short leaves every answer right (readers use only whole levels), and
 * the next run finishes the work.
 */
export function createRollupLevelsService(deps: { db: Db }) {
  async function settleOne(labId: number, scope: LabScope, c: ChannelLevels): Promise<SettledChannel> {
    const repo = rollupLevelsRepo(scope);
    const out: SettledChannel = { channelId: c.channelId, from: c.floor, to: c.floor, built: [], removed: 0 };
    const finer = c.wanted !== null && (c.floor === null || c.wanted < c.floor);
    if (finer) {
      const have = new Set(keptLevels(c.floor));
      const build = keptLevels(c.wanted).filter((r) => !have.has(r));
      const span = await repo.readingSpan(c.channelId);
      if (span) {
        const bounds = monthBounds(span.first, span.last);
        for (let i = 0; i + 1 < bounds.length; i++) {
          for (const res of build) {
            // REPEATABLE READ: the INSERT … SELECT takes shared next-key locks on the month's
            // readings, so a batch still writing there is waited for and counted, and one that
            // comes later adds its readings on top of the rebuilt bucket instead of being
            // overwritten. (Batches that began before the edit committed are already in: the
            // edit and ingestion both lock the logger's row.)
            await deps.db.transaction((trx) => rollupLevelsRepo(inLab(trx, labId)).buildFromRaw(c.channelId, res, bounds[i], bounds[i + 1]), {
              isolationLevel: 'repeatable read',
            });
          }
        }
      }
      if (await repo.lowerFloor(c.channelId, c.wanted!, c.floor)) {
        out.to = c.wanted;
        out.built = build;
      }
      return out;
    }
    if (c.floor !== c.wanted) {
      // coarser, and not raised in an edit transaction (an interrupted edit or another writer)
      await repo.raiseFloors({ channelIds: [c.channelId] });
      out.to = c.wanted;
    }
    if (await repo.hasRowsBelow(c.channelId, out.to)) out.removed = await repo.deleteBelow(c.channelId, out.to);
    return out;
  }

  return {
    /** Brings the rollup levels of the edited channels in line with their intervals (see above). */
    async settle(labId: number, target: IntervalEditTarget): Promise<SettledChannel[]> {
      const scope = inLab(deps.db, labId);
      const settled: SettledChannel[] = [];
      for (const c of await rollupLevelsRepo(scope).levels(target)) settled.push(await settleOne(labId, scope, c));
      return settled;
    },

    /**
     * The same for every channel of a lab (for a maintenance job under a cluster-wide lease):
     * finishes edits a crash cut short — a level half built, rows of a dropped level left — and
     * trims channels written without a floor (rows made outside channels.repo.ts keep every
     * level). Returns only the channels it changed. Costs one key seek per channel when there
     * is nothing to do.
     */
    async settleLab(labId: number): Promise<SettledChannel[]> {
      const scope = inLab(deps.db, labId);
      const changed: SettledChannel[] = [];
      for (const c of await rollupLevelsRepo(scope).levels({ wholeLab: true })) {
        const done = await settleOne(labId, scope, c);
        if (done.from !== done.to || done.removed > 0) changed.push(done);
      }
      return changed;
    },
  };
}

export type RollupLevelsService = ReturnType<typeof createRollupLevelsService>;
