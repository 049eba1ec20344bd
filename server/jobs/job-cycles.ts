import type { Db } from '../db/create-db.ts';
import { jobRunsRepo } from '../db/job-runs.repo.ts';
import { retryTransaction } from '../db/retry-transaction.ts';
import type { HeldLease } from './job-lease.ts';

/** How long cycles are remembered in `job_runs` before a job prunes them. */
export const JOB_RUNS_KEPT_MS = 7 * 86_400_000;

/** Rows of `job_runs` one prune deletes at most (a bounded delete; a backlog shrinks run by run). */
export const PRUNE_LIMIT = 1000;

/** The start of the cycle of length `cycleMs` that `at` (epoch ms) falls in: `at` floored to the interval, in UTC. */
export function cycleStart(at: number, cycleMs: number): Date {
  if (!Number.isInteger(cycleMs) || cycleMs < 1) throw new Error('cycleStart: cycleMs must be a whole number of milliseconds from 1');
  return new Date(Math.floor(at / cycleMs) * cycleMs);
}

/**
 * Once-per-cycle bookkeeping for a scheduled job that runs under a job lease (`job-lease.ts`):
 * however many app servers tick in a cycle, one claims it in `job_runs` and the others skip.
 *
 * Each write is a fenced transaction (the lease's fencing write first, then the claim or the
 * finish), rerun on lock conflicts: so only the lease's current holder can claim or finish a
 * cycle, and two claims of one cycle on two Galera nodes end with one row (the loser's commit
 * fails certification, its rerun finds the row and reports "already claimed").
 */
export function jobCycles(db: Db) {
  const runs = jobRunsRepo(db);

  /** `work` in one transaction that begins with the lease's fencing write (throws LeaseLostError when lost). */
  const fenced = <T>(lease: HeldLease, work: (trx: Db) => Promise<T>) =>
    retryTransaction(() =>
      db.transaction(async (trx) => {
        await lease.fence(trx);
        return work(trx as unknown as Db);
      }),
    );

  return {
    /** Claims cycle `periodStart` of the lease's job for its holder; false when it was claimed already. */
    claim: (lease: HeldLease, periodStart: Date, startedAt: Date): Promise<boolean> =>
      fenced(lease, (trx) => runs.claim(trx, { name: lease.name, periodStart, holder: lease.holder, fencing: lease.fencing, startedAt })),

    /** Records that the holder's claimed cycle `periodStart` finished at `at`. */
    finish: (lease: HeldLease, periodStart: Date, at: Date): Promise<boolean> =>
      fenced(lease, (trx) => runs.finish(trx, { name: lease.name, periodStart, holder: lease.holder, fencing: lease.fencing }, at)),

    /** Deletes (at most {@link PRUNE_LIMIT}) cycles of job `name` older than {@link JOB_RUNS_KEPT_MS} before `now`. */
    prune: (name: string, now: number): Promise<number> => runs.prune(name, new Date(now - JOB_RUNS_KEPT_MS), PRUNE_LIMIT),
  };
}

export type JobCycles = ReturnType<typeof jobCycles>;
