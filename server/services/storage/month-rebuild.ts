import type { Db } from '../../db/create-db.ts';
import { isDatabaseFull, isLockConflict } from '../../db/db-errors.ts';
import { parseMonthPartitionName, PartitionNameError } from '../../db/reading-partitions.ts';
import { stagingTableName, storageRebuildsRepo, type ReadingKey, type RebuildRecord } from '../../db/storage-rebuilds.repo.ts';
import type { LogWriter } from '../../log-writer.ts';

/** Rows per copy or put-back statement: each is its own short transaction. */
export const REBUILD_BATCH_ROWS = 20_000;
/**
 * Longest wait (seconds) for running transactions on `readings` before one swap attempt gives
 * up. While the swap waits, new statements on `readings` queue behind it, so the wait is short
 * and the swap is tried again a little later instead.
 */
export const EXCHANGE_LOCK_WAIT_S = 2;
/** Swap attempts per run (a second apart) before the month waits for the next run. */
export const EXCHANGE_ATTEMPTS = 5;

/** A step of the rebuild just finished (tests throw from `afterStep` to simulate a crash there). */
export type RebuildStep = 'copy-batch' | 'copied' | 'exchanged' | 'put-back-batch' | 'put-back';

/** The rebuild stopped because the database has no room; the record says so and the next run resumes. */
export class RebuildOutOfRoomError extends Error {
  constructor(
    readonly partitionName: string,
    cause: unknown,
  ) {
    super(`rebuild of readings ${partitionName} stopped: the database has no room left`, { cause });
    this.name = 'RebuildOutOfRoomError';
  }
}

/** What `rebuild` did for one month. */
export type RebuildOutcome = 'rebuilt' | 'already-done';

/**
 * Rebuilds one closed month of `readings` online, so its pages compress as well as freshly
 * written ones (rows that arrived over a month in 5,000-row batches leave half-full pages; a copy
 * in key order packs them). `ALTER TABLE … REBUILD PARTITION` would block every insert into the
 * table while it runs, so instead:
 *
 *  1. copy — the month's rows of live labs go, in key order and bounded batches (keyset
 *     pagination, READ COMMITTED, no locks on `readings`), into a page-compressed staging table,
 *     which is then rebuilt by a sorted index build (`packStaging`: rows inserted in key order fill
 *     pages to the brim, and full pages compress into one 4 KiB block more; the staging table is
 *     private, so its lock holds nobody up);
 *  2. swap — `EXCHANGE PARTITION` puts the copy in the month's place (a metadata swap; the old
 *     partition becomes the staging table). The staging table's tablespace id is recorded first:
 *     after a crash, the partition carrying that id proves the swap happened;
 *  3. put back — every row the old partition holds that the new one lacks (readings that
 *     arrived for the month during the copy) is inserted (`INSERT IGNORE … SELECT`); rows of labs
 *     deleted meanwhile are removed, so a deleted lab never comes back; the staging table goes.
 *
 * Every step is recorded in `storage_rebuilds` and every batch commits on its own, so a crash at
 * any point resumes where it stopped, and at every moment each reading is in `readings` or (only
 * between swap and put-back) in the staging table that the put-back drains. A full disk stops the
 * rebuild with one log line: a copy not yet swapped is dropped (giving the room back to ingestion);
 * after the swap the staging table is kept for the put-back of the next run.
 */
export function createMonthRebuild(deps: {
  db: Db;
  logger: LogWriter;
  now?: () => Date;
  batchRows?: number;
  /** Swap attempts per run and the lock wait of each (defaults EXCHANGE_ATTEMPTS, EXCHANGE_LOCK_WAIT_S). */
  exchange?: { attempts: number; lockWaitSeconds: number; pauseMs: number };
  /** Called between batches (the job renews its leases here; a lost lease throws and stops the rebuild). */
  onBatch?: () => Promise<void>;
  afterStep?: (step: RebuildStep, partitionName: string) => void | Promise<void>;
}) {
  const now = deps.now ?? (() => new Date());
  const batchRows = deps.batchRows ?? REBUILD_BATCH_ROWS;
  const exchange = deps.exchange ?? { attempts: EXCHANGE_ATTEMPTS, lockWaitSeconds: EXCHANGE_LOCK_WAIT_S, pauseMs: 1000 };
  const repo = storageRebuildsRepo(deps.db);

  function monthOf(partitionName: string): number {
    const m = parseMonthPartitionName(partitionName);
    if (m === null) throw new PartitionNameError(partitionName);
    return m;
  }

  /** Step 1: fills the staging table with the month's rows (resuming after the last key copied). */
  async function copy(partitionName: string): Promise<number> {
    const monthStart = monthOf(partitionName);
    const staging = stagingTableName(partitionName);
    await repo.ensureStaging(staging);
    let after: ReadingKey | null = await repo.lastKey(staging);
    let copied = (await repo.get(monthStart))?.rowsCopied ?? 0;
    if (after === null) copied = 0;
    for (;;) {
      const end = await repo.batchEnd('readings', partitionName, after, batchRows);
      copied += await repo.copyBatch(partitionName, staging, after, end);
      await repo.update(monthStart, { rowsCopied: copied });
      await deps.afterStep?.('copy-batch', partitionName);
      if (end === null) break;
      after = end;
      await deps.onBatch?.();
    }
    await deps.afterStep?.('copied', partitionName);
    return copied;
  }

  /** Step 2: packs the copy (a sorted rebuild of the private staging table), records its tablespace, then swaps it in for the month's partition. */
  async function swap(partitionName: string): Promise<void> {
    const monthStart = monthOf(partitionName);
    const staging = stagingTableName(partitionName);
    // the pack makes a new tablespace: its id is read after it
    await repo.packStaging(staging);
    const space = await repo.spaceId(staging);
    if (space === null) throw new Error(`rebuild of readings ${partitionName}: the staging copy is missing`);
    await repo.update(monthStart, { stagingSpaceId: space });
    // the swap is the one step two holders must never both take: renew (a lost lease throws) right before it
    await deps.onBatch?.();
    for (let attempt = 1; ; attempt++) {
      try {
        await repo.exchange(partitionName, staging, exchange.lockWaitSeconds);
        break;
      } catch (err) {
        // a long transaction on readings holds the table: nothing changed; try again shortly
        if (!isLockConflict(err) || attempt >= exchange.attempts) throw err;
        await new Promise((r) => setTimeout(r, exchange.pauseMs));
        await deps.onBatch?.();
      }
    }
    await deps.afterStep?.('exchanged', partitionName);
    await repo.update(monthStart, { status: 'swapped' });
  }

  /** True when the month's partition is the recorded staging copy (the swap happened). */
  async function swapped(record: RebuildRecord): Promise<boolean> {
    if (record.status !== 'copying') return true;
    if (record.stagingSpaceId === null) return false;
    return (await repo.spaceId('readings', record.partitionName)) === record.stagingSpaceId;
  }

  /** Step 3: puts back rows the copy missed, removes deleted labs' rows, drops the staging table. */
  async function putBack(partitionName: string): Promise<number> {
    const monthStart = monthOf(partitionName);
    const staging = stagingTableName(partitionName);
    let putBackRows = (await repo.get(monthStart))?.rowsPutBack ?? 0;
    if (await repo.stagingExists(staging)) {
      // From the start every time: INSERT IGNORE makes a repeated batch harmless.
      let after: ReadingKey | null = null;
      for (;;) {
        const end = await repo.batchEnd(staging, null, after, batchRows);
        putBackRows += await repo.putBackBatch(staging, after, end);
        await repo.update(monthStart, { rowsPutBack: putBackRows });
        await deps.afterStep?.('put-back-batch', partitionName);
        if (end === null) break;
        after = end;
        await deps.onBatch?.();
      }
    } else {
      deps.logger.warn('storage rebuild: the old copy of a swapped month is missing; nothing to put back', { partition: partitionName });
    }
    for (const labId of await repo.deadLabsIn(partitionName)) {
      while ((await repo.removeLabRows(partitionName, labId, batchRows)) === batchRows) await deps.onBatch?.();
    }
    await deps.afterStep?.('put-back', partitionName);
    await repo.dropStaging(staging);
    await repo.update(monthStart, { status: 'done', finishedAt: now(), lastError: null });
    return putBackRows;
  }

  /** Takes one month from wherever its record stands to done. */
  async function rebuild(partitionName: string): Promise<RebuildOutcome> {
    const monthStart = monthOf(partitionName);
    await repo.start(monthStart, partitionName, now());
    const record = (await repo.get(monthStart)) as RebuildRecord;
    if (record.status === 'done') return 'already-done';
    try {
      if (!(await swapped(record))) {
        await copy(partitionName);
        await swap(partitionName);
      } else if (record.status === 'copying') {
        await repo.update(monthStart, { status: 'swapped' });
      }
      await putBack(partitionName);
      return 'rebuilt';
    } catch (err) {
      if (isDatabaseFull(err)) {
        const current = await repo.get(monthStart).catch(() => null);
        if (current && current.status === 'copying' && !(await swapped(current).catch(() => true))) {
          await repo.dropStaging(stagingTableName(partitionName)).catch(() => undefined);
          await repo.update(monthStart, { stagingSpaceId: null, rowsCopied: 0 }).catch(() => undefined);
        }
        await repo.update(monthStart, { lastError: 'the database has no room left' }).catch(() => undefined);
        throw new RebuildOutOfRoomError(partitionName, err);
      }
      await repo.update(monthStart, { lastError: String(err) }).catch(() => undefined);
      throw err;
    }
  }

  return { rebuild, copy, swap, putBack };
}

export type MonthRebuild = ReturnType<typeof createMonthRebuild>;
