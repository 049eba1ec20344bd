import type { Db } from './create-db.ts';
import type { DbOrTrx } from './tenant-scope.ts';

/** One cycle of a scheduled job as recorded in `job_runs`. */
export interface JobRunRow {
  name: string;
  periodStart: Date;
  holder: string;
  fencing: number;
  startedAt: Date;
  finishedAt: Date | null;
}

const toRow = (r: Record<string, unknown>): JobRunRow => ({
  name: String(r.name),
  periodStart: new Date(r.period_start as Date | string),
  holder: String(r.holder),
  fencing: Number(r.fencing),
  startedAt: new Date(r.started_at as Date | string),
  finishedAt: r.finished_at === null ? null : new Date(r.finished_at as Date | string),
});

/**
 * Data access for `job_runs` (global: one row per cycle of a cluster-wide scheduled job). The
 * claim and the finish are written in the caller's transaction, the one that also makes the
 * lease's fencing write, so a cycle is claimed only by the lease's current holder.
 */
export function jobRunsRepo(db: Db) {
  return {
    /**
     * Claims cycle `periodStart` of job `name` for `holder` (fencing number `fencing`) in `trx`.
     * Returns false when the cycle was claimed already (by anyone, this holder included): the
     * primary key refuses a second row, and INSERT IGNORE turns that into "0 rows".
     */
    async claim(trx: DbOrTrx, run: { name: string; periodStart: Date; holder: string; fencing: number; startedAt: Date }): Promise<boolean> {
      const [result] = (await trx.raw('INSERT IGNORE INTO job_runs (name, period_start, holder, fencing, started_at) VALUES (?, ?, ?, ?, ?)', [
        run.name,
        run.periodStart,
        run.holder,
        run.fencing,
        run.startedAt,
      ])) as unknown as [{ affectedRows: number }];
      return result.affectedRows === 1;
    },

    /** Marks a claimed cycle finished at `at`, if it is still the claim of `holder`/`fencing`. */
    async finish(trx: DbOrTrx, run: { name: string; periodStart: Date; holder: string; fencing: number }, at: Date): Promise<boolean> {
      const changed = await trx('job_runs')
        .where({ name: run.name, period_start: run.periodStart, holder: run.holder, fencing: run.fencing })
        .update({ finished_at: at });
      return changed === 1;
    },

    /**
     * Deletes at most `limit` rows of job `name` whose cycle began before `before`, oldest first
     * (a bounded delete: a small write set and short row locks however long the job was left
     * unpruned). Returns how many it deleted.
     */
    async prune(name: string, before: Date, limit: number): Promise<number> {
      return db('job_runs').where('name', name).where('period_start', '<', before).orderBy('period_start').limit(limit).delete();
    },

    /** The cycles of job `name` from `from` (inclusive) to `to` (exclusive), oldest first (tests and the fault test read them). */
    async between(name: string, from: Date, to: Date): Promise<JobRunRow[]> {
      const rows = await db('job_runs').where('name', name).where('period_start', '>=', from).where('period_start', '<', to).orderBy('period_start');
      return rows.map(toRow);
    },
  };
}

export type JobRunsRepo = ReturnType<typeof jobRunsRepo>;
