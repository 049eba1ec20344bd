import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import { labBillingRepo } from '../../db/lab-billing.repo.ts';
import { listPartitions } from '../../db/reading-partitions.ts';
import { retentionRecordsRepo } from '../../db/retention.repo.ts';
import type { LogWriter } from '../../log-writer.ts';
import { repeatingJob } from '../../jobs/background-jobs.ts';
import { createLeaseRunner, type HeldLease } from '../../jobs/job-lease.ts';
import { effectivePlan } from '../billing/effective-plan.ts';
import type { PlanCatalog } from '../billing/plan-catalog.ts';
import { planRetention, removalHorizon, type PartitionForPlan } from './retention-plan.ts';
import { dropJournaledPartition, journalPartitionDrop, resolveOpenDrops, settlePartitionDrop } from './partition-drops.ts';
import { planInForceSince } from './plan-in-force-since.ts';
import { pruneLab, PRUNE_BATCH_ROWS } from './prune-lab.ts';

/** How often retention runs in the server (it also runs once right after start). */
export const RETENTION_INTERVAL_MS = 24 * 3_600_000;
/** The lease 'retention' is taken for this long and renewed before every step that writes. */
export const RETENTION_LEASE_TTL_MS = 10 * 60_000;
export const RETENTION_LEASE = 'retention';

/** What one run did. */
export interface RetentionRunSummary {
  runId: number;
  partitionsDropped: string[];
  /** Readings removed by dropped partitions (including those a crashed run left to settle) and by per-lab batches. */
  readingsRemoved: number;
  labsPruned: number;
  /** Journal rows of a crashed run: settled now, or cancelled to be decided afresh. */
  resumed: { settled: number; cancelled: number };
  errors: string[];
}

/**
 * Each lab's removal horizon from its effective plan now (`removalHorizon`); labs whose plan keeps
 * everything get −∞. Deleted labs are left out (the lab deletion job removes their rows), so
 * their rows hold any partition they are in.
 */
export async function labHorizons(db: Db, catalog: PlanCatalog, at: Date): Promise<Map<number, number>> {
  const horizons = new Map<number, number>();
  for (const lab of await crossLabRepo(db).allLabs()) {
    const billing = await labBillingRepo(inLab(db, lab.id)).get();
    const plan = effectivePlan(billing, catalog, at);
    const policy = { historyDays: plan.limits.historyDays, readingRemoval: plan.readingRemoval, inForceSinceMs: planInForceSince(billing) };
    horizons.set(lab.id, removalHorizon(policy, at.getTime()));
  }
  return horizons;
}

/**
 * The retention job (issue #20 item 3): once a day, under the cluster-wide lease 'retention' (one
 * app server runs it), it removes the readings a lab's plan no longer keeps — readings before the
 * lab's horizon (`removalHorizon`), never one at or after it, and nothing for a plan that keeps
 * everything (every plan shipped today). First it finishes any partition drop a crashed run left
 * in the journal; then it drops whole month partitions every lab of which is past them
 * (`DROP PARTITION`, milliseconds); then it prunes each removing lab's remaining older readings
 * in bounded batches. Every run is recorded in `retention_runs`. `runOnce` takes the time from
 * `now`, so tests drive it with a simulated clock.
 */
export function createRetentionJob(deps: {
  db: Db;
  catalog: PlanCatalog;
  logger: LogWriter;
  /** This process's lease holder name (processHolderName()). */
  holder: string;
  now?: () => Date;
  batchRows?: number;
}) {
  const { db, catalog, logger } = deps;
  const now = deps.now ?? (() => new Date());
  const leases = createLeaseRunner({ db, holder: deps.holder, now });
  const records = retentionRecordsRepo(db);

  /** The partitions of `readings` that could go for some lab, with the labs holding rows in each. */
  async function candidatePartitions(horizons: ReadonlyMap<number, number>): Promise<PartitionForPlan[]> {
    const latest = Math.max(Number.NEGATIVE_INFINITY, ...horizons.values());
    const out: PartitionForPlan[] = [];
    for (const p of await listPartitions(db, 'readings')) {
      if (p.kind === 'future' || p.monthEnd > latest) continue;
      out.push({ name: p.name, kind: p.kind, monthEnd: p.monthEnd, labIds: await records.labsInPartition('readings', p.name) });
    }
    return out;
  }

  async function steps(lease: HeldLease, runId: number, summary: RetentionRunSummary): Promise<void> {
    const at = now();
    const horizons = await labHorizons(db, catalog, at);
    const resumed = await resolveOpenDrops(db, horizons, at, () => lease.renew());
    summary.resumed = { settled: resumed.settled, cancelled: resumed.cancelled };
    summary.readingsRemoved += resumed.readings;

    const candidates = await candidatePartitions(horizons);
    const plan = planRetention({ horizons, partitions: candidates });
    for (const name of plan.dropPartitions) {
      await lease.renew();
      const partition = candidates.find((p) => p.name === name)!;
      // decided again on the partition's exact rows per channel, which the journal keeps
      const drop = await journalPartitionDrop(db, runId, partition, horizons, now());
      if (!drop) continue;
      await lease.renew();
      await dropJournaledPartition(db, drop, horizons);
      await settlePartitionDrop(db, drop, now());
      summary.partitionsDropped.push(name);
      summary.readingsRemoved += drop.readings;
      logger.info('retention dropped a month partition', { partition: name, readings: drop.readings });
    }

    for (const { labId, beforeMs } of plan.prune) {
      try {
        const removed = await pruneLab(db, labId, beforeMs, { batchRows: deps.batchRows ?? PRUNE_BATCH_ROWS, beforeEachBatch: () => lease.renew() });
        summary.readingsRemoved += removed;
        summary.labsPruned++;
        if (removed > 0)
          logger.info('retention removed readings before the lab’s horizon', { labId, before: new Date(beforeMs).toISOString(), readings: removed });
      } catch (err) {
        if ((err as Error).name === 'LeaseLostError') throw err;
        // one lab's failure must not hold up the others; the next run retries it
        summary.errors.push(`lab ${labId}: ${String(err)}`);
        logger.warn('retention failed for a lab; the next run retries', { labId, err: String(err) });
      }
    }
  }

  /**
   * One run, if this process gets the lease 'retention' (otherwise it skips quietly and answers
   * `ran: false`). A run that fails part way is recorded with its error; what it completed stays
   * done and the next run resumes from the journal and the data as it is.
   */
  async function runOnce(): Promise<{ ran: true; summary: RetentionRunSummary } | { ran: false; heldBy: string }> {
    const outcome = await leases.run(RETENTION_LEASE, RETENTION_LEASE_TTL_MS, async (lease) => {
      const runId = await records.startRun(deps.holder, now());
      const summary: RetentionRunSummary = {
        runId,
        partitionsDropped: [],
        readingsRemoved: 0,
        labsPruned: 0,
        resumed: { settled: 0, cancelled: 0 },
        errors: [],
      };
      try {
        await steps(lease, runId, summary);
      } catch (err) {
        summary.errors.push(String(err));
        throw err;
      } finally {
        await records
          .finishRun(runId, now(), {
            readingsRemoved: summary.readingsRemoved,
            partitionsDropped: summary.partitionsDropped.length,
            lastError: summary.errors.at(-1) ?? null,
          })
          .catch((err: unknown) => logger.warn('retention could not record the end of its run', { runId, err: String(err) }));
      }
      return summary;
    });
    if (!outcome.ran) {
      logger.info('retention skipped: another app server holds the lease', { heldBy: outcome.heldBy });
      return outcome;
    }
    return { ran: true, summary: outcome.value };
  }

  const job = repeatingJob({
    name: 'retention',
    everyMs: RETENTION_INTERVAL_MS,
    run: runOnce,
    logger: logger,
    failedMessage: 'retention run failed; the next run resumes',
  });
  return { job, runOnce };
}
