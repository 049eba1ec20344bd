import type { Db } from '../../db/create-db.ts';
import {
  addMonths,
  dropDetachedLeftovers,
  ensureMonthsUpTo,
  isPartitioned,
  listPartitions,
  PARTITIONED_TABLES,
  REBUILD_GRACE_MS,
} from '../../db/reading-partitions.ts';
import { stagingTableName, storageRebuildsRepo, type RebuildRecord } from '../../db/storage-rebuilds.repo.ts';
import { repeatingJob } from '../../jobs/background-jobs.ts';
import { createLeaseRunner, type HeldLease } from '../../jobs/job-lease.ts';
import type { LogWriter } from '../../log-writer.ts';
import { createMonthRebuild, RebuildOutOfRoomError, type RebuildStep } from './month-rebuild.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import { createRollupLevelsService } from '../rollup-levels.service.ts';

/** How often the job runs in the server (it also runs once right after start). */
export const STORAGE_JOB_INTERVAL_MS = 60 * 60_000;
/** Months made ahead of the current one on both tables. */
export const MONTHS_AHEAD = 3;
/** The lease guarding this job across app servers, and its time to live (renewed between batches). */
export const STORAGE_LEASE = 'storage-maintenance';
/**
 * Retention deletes rows of old months; a row it deleted from a month being copied would come
 * back with the copy (and be uncounted twice). The rebuild of a month therefore also holds the
 * retention lease, so the two never overlap.
 */
export const RETENTION_LEASE = 'retention';
export const STORAGE_LEASE_TTL_MS = 10 * 60_000;

/** What one run did. */
export interface StorageRunSummary {
  /** Partitions made ahead, as `table.name`. */
  monthsMade: string[];
  /** Months of readings rebuilt in this run (partition names). */
  rebuilt: string[];
  /** Channels whose rollup levels were settled (a level built or removed after an interval change a crash cut short). */
  rollupsSettled?: number;
  /** Set when the run stopped early (another holder, no room, a failure). */
  stopped: string | null;
}

/** The rebuild state for the operator (ops CLI `storage`). */
export interface StorageProgress {
  rebuilds: RebuildRecord[];
  /** Closed months of readings not yet rebuilt. */
  pending: string[];
}

/** Closed months of readings (ended at least REBUILD_GRACE_MS before `now`) whose rebuild is not done, oldest first. */
export async function pendingRebuildMonths(db: Db, now: Date): Promise<string[]> {
  if (!(await isPartitioned(db, 'readings'))) return [];
  const done = new Set((await storageRebuildsRepo(db).all()).filter((r) => r.status === 'done').map((r) => r.partitionName));
  const cutoff = now.getTime() - REBUILD_GRACE_MS;
  return (await listPartitions(db, 'readings')).filter((p) => p.kind === 'month' && p.monthEnd <= cutoff && !done.has(p.name)).map((p) => p.name);
}

/**
 * The storage maintenance job (issue #20 item 2), once across app servers under the lease
 * 'storage-maintenance': (a) keeps month partitions made up to three months ahead on `readings`
 * and `reading_rollups`, so the future catch-all never has to be split while it holds rows;
 * (b) rebuilds each closed month of `readings` (month end plus a day in the past) once, online,
 * by copy and swap (see month-rebuild.ts), oldest first.
 *
 * Rollups are not rebuilt: late readings update rollup rows in place, so a copy and swap could
 * lose such an update, and `ALTER TABLE … FORCE` online rebuilds every partition of the table each
 * time; with redundant levels gone the rollups are a small share of the bytes.
 *
 * `runOnce` takes its time from `now`, so tests drive it with a simulated clock; no timer runs in
 * tests. A database without partitioned tables (migrations not run) is skipped with a warning.
 */
export function createStorageMaintenanceJob(deps: {
  db: Db;
  logger: LogWriter;
  /** This process's lease holder name (processHolderName()). */
  holder: string;
  now?: () => Date;
  batchRows?: number;
  afterStep?: (step: RebuildStep, partitionName: string) => void | Promise<void>;
}) {
  const now = deps.now ?? (() => new Date());
  const leases = createLeaseRunner({ db: deps.db, holder: deps.holder, now });
  const repo = storageRebuildsRepo(deps.db);

  /** Makes month partitions up to MONTHS_AHEAD months after `now` on both tables. */
  async function ensureMonthsAhead(): Promise<string[]> {
    const made: string[] = [];
    const until = addMonths(now().getTime(), MONTHS_AHEAD);
    for (const table of PARTITIONED_TABLES) {
      if (!(await isPartitioned(deps.db, table))) {
        deps.logger.warn('storage maintenance: table is not partitioned (migrations not run?); months ahead skipped', { table });
        continue;
      }
      for (const name of await ensureMonthsUpTo(deps.db, table, until)) made.push(`${table}.${name}`);
    }
    if (made.length > 0) deps.logger.info('storage maintenance: month partitions made ahead', { partitions: made });
    return made;
  }

  const pendingMonths = () => pendingRebuildMonths(deps.db, now());

  /**
   * Rebuilds left unfinished for a month whose partition is gone since (retention dropped it after
   * a crash): the staging copy is dropped and the record closed, so nothing waits on it forever.
   */
  async function closeOrphans(): Promise<void> {
    const months = new Set((await listPartitions(deps.db, 'readings')).map((p) => p.name));
    for (const r of await repo.all()) {
      if (r.status === 'done' || months.has(r.partitionName)) continue;
      await repo.dropStaging(stagingTableName(r.partitionName));
      await repo.update(r.monthStart, { status: 'done', finishedAt: now(), lastError: 'the month was dropped before its rebuild finished' });
      deps.logger.warn('storage maintenance: a month was dropped before its rebuild finished; its copy is removed', { partition: r.partitionName });
    }
  }

  /**
   * Rebuilds every closed, not yet rebuilt month of readings, oldest first. `leasesHeld` are renewed
   * between batches (a lost lease stops the rebuild; the next holder resumes it). Stops at the first
   * failure: a full disk logs one clear line; ingestion is never involved.
   */
  async function rebuildClosedMonths(leasesHeld: HeldLease[] = []): Promise<{ rebuilt: string[]; stopped: string | null }> {
    const rebuild = createMonthRebuild({
      db: deps.db,
      logger: deps.logger,
      now,
      batchRows: deps.batchRows,
      afterStep: deps.afterStep,
      onBatch: async () => {
        for (const lease of leasesHeld) await lease.renew();
      },
    });
    const rebuilt: string[] = [];
    if (await isPartitioned(deps.db, 'readings')) await closeOrphans();
    for (const name of await pendingMonths()) {
      try {
        if ((await rebuild.rebuild(name)) === 'rebuilt') {
          rebuilt.push(name);
          deps.logger.info('storage maintenance: closed month of readings rebuilt', { partition: name });
        }
      } catch (err) {
        if (err instanceof RebuildOutOfRoomError) {
          deps.logger.error(
            `storage maintenance: rebuild of readings ${name} stopped — the database has no room left; readings are intact and ingestion goes on; free disk space and the next run resumes`,
            { partition: name },
          );
          return { rebuilt, stopped: 'no room left' };
        }
        deps.logger.warn('storage maintenance: rebuild of a closed month stopped; the next run resumes it', { partition: name, err: String(err) });
        return { rebuilt, stopped: String(err) };
      }
    }
    return { rebuilt, stopped: null };
  }

  /** One run under the leases: months ahead, then the rebuilds (which also hold the retention lease). */
  async function runOnce(): Promise<StorageRunSummary> {
    const outcome = await leases.run(STORAGE_LEASE, STORAGE_LEASE_TTL_MS, async (storageLease) => {
      const leftovers = await dropDetachedLeftovers(deps.db);
      if (leftovers.length) deps.logger.info('storage maintenance: removed months a crash left detached', { tables: leftovers });
      const monthsMade = await ensureMonthsAhead();
      const rollupsSettled = await settleRollupLevels(storageLease);
      const inner = await leases.run(RETENTION_LEASE, STORAGE_LEASE_TTL_MS, (retentionLease) => rebuildClosedMonths([storageLease, retentionLease]));
      if (!inner.ran) {
        deps.logger.info('storage maintenance: retention is running elsewhere; rebuilds wait for the next run', { heldBy: inner.heldBy });
        return { monthsMade, rollupsSettled, rebuilt: [], stopped: `retention lease held by ${inner.heldBy}` };
      }
      return { monthsMade, rollupsSettled, ...inner.value };
    });
    if (!outcome.ran) {
      deps.logger.info('storage maintenance: another server holds the lease; skipped', { heldBy: outcome.heldBy });
      return { monthsMade: [], rebuilt: [], stopped: `lease held by ${outcome.heldBy}` };
    }
    return outcome.value;
  }

  /**
   * Finishes rollup-level changes that an interval change started and a crash cut short (a finer
   * level built from the history, a coarser floor's leftover rows removed), lab by lab; nothing to
   * do is the usual case. One lab's failure is logged and retried next run.
   */
  async function settleRollupLevels(lease: HeldLease): Promise<number> {
    const levels = createRollupLevelsService({ db: deps.db });
    let settled = 0;
    for (const lab of await crossLabRepo(deps.db).allLabs()) {
      await lease.renew();
      try {
        const changed = await levels.settleLab(lab.id);
        if (changed.length) deps.logger.info('storage maintenance: rollup levels settled', { labId: lab.id, channels: changed.map((c) => c.channelId) });
        settled += changed.length;
      } catch (err) {
        deps.logger.warn('storage maintenance: settling rollup levels failed for a lab; the next run retries', { labId: lab.id, err: String(err) });
      }
    }
    return settled;
  }

  /** The rebuild records and the closed months still waiting. */
  async function progress(): Promise<StorageProgress> {
    return { rebuilds: await repo.all(), pending: await pendingMonths() };
  }

  const job = repeatingJob({
    name: 'storage maintenance',
    everyMs: STORAGE_JOB_INTERVAL_MS,
    run: runOnce,
    logger: deps.logger,
    failedMessage: 'storage maintenance failed; the next run retries',
  });
  return { job, runOnce, ensureMonthsAhead, rebuildClosedMonths, progress };
}

export type StorageMaintenanceJob = ReturnType<typeof createStorageMaintenanceJob>;
