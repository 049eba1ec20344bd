import type { Db } from '../../db/create-db.ts';
import { inLab, type LabOwnedTable } from '../../db/tenant-scope.ts';
import { labDeletionsRepo, labRowsRepo, type LabDeletionRecord } from '../../db/lab-deletions.repo.ts';
import { repeatingJob } from '../../jobs/background-jobs.ts';
import type { LogWriter } from '../../log-writer.ts';
import { DELETION_ORDER } from './deletion-order.ts';

/** Rows removed per statement: small transactions that hold row locks for a moment only. */
export const DELETION_BATCH_ROWS = 5000;
/** How often the job looks for unfinished deletions (it also runs right after each request). */
export const DELETION_JOB_INTERVAL_MS = 60_000;
/** Passes over every table before a deletion gives up for this run (a row written meanwhile needs a second). */
const MAX_PASSES = 3;

/** One batch done: which lab, which table, how many rows went (tests use it to stop the job midway). */
export interface DeletionBatch {
  labId: number;
  table: LabOwnedTable;
  removed: number;
}

/** What one run did: the deletions finished, and those that stopped with an error (retried next run). */
export interface DeletionRunSummary {
  finished: number[];
  failed: number[];
}

/**
 * The lab deletion job: for every deletion recorded and not finished, removes the lab's rows
 * table by table in DELETION_ORDER, at most `batchRows` rows per statement, each batch in its
 * own small transaction together with the record's tally (so the tally never counts a batch
 * that did not commit). When every lab-owned table is empty for the lab, it removes the lab row
 * and marks the record finished. All state is in the database, so a run that dies midway (a
 * crash, a restart) is simply resumed by the next one. Tests leave the timer off and call
 * `runOnce` themselves.
 */
export function createLabDeletionJob(deps: {
  db: Db;
  logger: LogWriter;
  now?: () => Date;
  batchRows?: number;
  /** Called after each committed batch (tests throw here to simulate a crash). */
  afterBatch?: (batch: DeletionBatch) => void | Promise<void>;
  /** Called at the start of each run: hands over deletions whose request died midway (LabDeletionService.settleStalled). */
  beforeRun?: () => Promise<unknown>;
}) {
  const now = deps.now ?? (() => new Date());
  const batchRows = deps.batchRows ?? DELETION_BATCH_ROWS;

  /** Empties one table of the lab, batch by batch. */
  async function emptyTable(record: LabDeletionRecord, table: LabOwnedTable): Promise<void> {
    for (;;) {
      const removed = await deps.db.transaction(async (trx) => {
        const n = await labRowsRepo(inLab(trx, record.labId)).removeBatch(table, batchRows);
        if (n > 0) await labDeletionsRepo(trx).addRemoved(record.id, table, n);
        return n;
      });
      await deps.afterBatch?.({ labId: record.labId, table, removed });
      if (removed < batchRows) return;
    }
  }

  /** Tables of the lab that still hold rows (rows written while a pass ran, e.g. by a late webhook). */
  async function leftovers(labId: number): Promise<LabOwnedTable[]> {
    const rows = labRowsRepo(inLab(deps.db, labId));
    const left: LabOwnedTable[] = [];
    for (const table of DELETION_ORDER) if (await rows.hasRows(table)) left.push(table);
    return left;
  }

  async function finish(record: LabDeletionRecord): Promise<void> {
    let left: LabOwnedTable[] = [...DELETION_ORDER];
    for (let pass = 0; pass < MAX_PASSES && left.length > 0; pass++) {
      for (const table of left) await emptyTable(record, table);
      left = await leftovers(record.labId);
    }
    if (left.length > 0) throw new Error(`rows keep appearing in ${left.join(', ')}; retried next run`);
    await deps.db.transaction(async (trx) => {
      const repo = labDeletionsRepo(trx);
      await repo.removeDeletedLab(record.labId);
      await repo.finish(record.id, now());
    });
  }

  /** Works through every unfinished deletion once; a failing one is noted on its record and retried next run. */
  async function runOnce(): Promise<DeletionRunSummary> {
    const summary: DeletionRunSummary = { finished: [], failed: [] };
    await deps.beforeRun?.().catch((err: unknown) => deps.logger.warn('stalled lab deletions not settled; the next run retries', { err: String(err) }));
    for (const record of await labDeletionsRepo(deps.db).unfinished()) {
      try {
        await finish(record);
        summary.finished.push(record.labId);
        deps.logger.info('lab deleted', { labId: record.labId, slug: record.labSlug });
      } catch (err) {
        summary.failed.push(record.labId);
        deps.logger.warn('lab deletion stopped; the next run resumes it', { labId: record.labId, err: String(err) });
        await labDeletionsRepo(deps.db)
          .setError(record.id, String(err))
          .catch(() => undefined);
      }
    }
    return summary;
  }

  const job = repeatingJob({
    name: 'lab deletion',
    everyMs: DELETION_JOB_INTERVAL_MS,
    run: runOnce,
    logger: deps.logger,
    failedMessage: 'lab deletion run failed; the next run retries',
  });
  return {
    job,
    runOnce,
    /** Starts a run now if the job is running in this process (after a deletion request); a no-op in tests. */
    kick: job.kick,
  };
}

export type LabDeletionJob = ReturnType<typeof createLabDeletionJob>;
