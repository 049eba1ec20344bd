import type { DbOrTrx } from './tenant-scope.ts';
import type { Db } from './create-db.ts';
import { isLockConflict } from './db-errors.ts';
import { retryTransaction } from './retry-transaction.ts';

/** One lease row as stored. */
export interface LeaseRow {
  name: string;
  /** '' when nobody holds it (never taken, or released). */
  holder: string;
  expiresAt: Date;
  fencing: number;
}

/** What an attempt to take a lease found. */
export type TakeResult = { taken: true; fencing: number } | { taken: false; heldBy: string };

/** The holder string of a lease nobody holds. */
export const NO_HOLDER = '';

/** What `take` reports as the holder when another server was taking the lease at the same moment. */
export const CONTESTED = '(being taken by another server)';

const toRow = (r: { name: string; holder: string; expires_at: Date | string; fencing: number | string }): LeaseRow => ({
  name: r.name,
  holder: r.holder,
  expiresAt: r.expires_at instanceof Date ? r.expires_at : new Date(r.expires_at),
  fencing: Number(r.fencing),
});

/**
 * Data access for `job_leases` (global: one row per cluster-wide job). Every time comparison
 * uses the `now` the caller passes, never the database's clock, so the lease runner can be driven
 * by a simulated clock in tests; app servers keep their clocks in step (NTP), and the lease's
 * time to live is far longer than any drift between them.
 */
export function jobLeasesRepo(db: Db) {
  /** The row for `name`, or null (read on `conn`, locking it when asked). */
  async function read(conn: DbOrTrx, name: string, forUpdate = false): Promise<LeaseRow | null> {
    const q = conn('job_leases').where('name', name).first('name', 'holder', 'expires_at', 'fencing');
    const r = await (forUpdate ? q.forUpdate() : q);
    return r ? toRow(r) : null;
  }

  return {
    /** The lease row for `name` as it is now, or null when it was never taken. */
    current: (name: string) => read(db, name),

    /**
     * Takes the lease for `holder` until `expiresAt` when nobody holds it, it has expired by
     * `now`, or `holder` already holds it. The fencing number goes up by one whenever the holder
     * changes (including a release and a retake), never when a holder extends its own lease.
     * One ordinary transaction: the row is made if absent, read under a row lock, and updated
     * only if it is still exactly what was read (so the decision also holds where row locks are
     * not cluster-wide, as under Galera, whose certification refuses the loser's commit instead).
     * A lock conflict reruns the transaction (`retryTransaction`: the rerun usually finds the
     * winner's row and answers "not taken"); one that outlasts the retries means another server
     * was taking it at that moment, so it also counts as not taken.
     */
    async take(name: string, holder: string, now: Date, expiresAt: Date): Promise<TakeResult> {
      try {
        return await retryTransaction(async () => {
          await db.raw('INSERT IGNORE INTO job_leases (name, holder, expires_at, fencing) VALUES (?, ?, ?, 0)', [name, NO_HOLDER, new Date(0)]);
          return db.transaction(async (trx): Promise<TakeResult> => {
            const row = await read(trx, name, true);
            if (!row) throw new Error(`job lease ${name} vanished while being taken`);
            const ours = row.holder === holder;
            const free = row.holder === NO_HOLDER || row.expiresAt.getTime() <= now.getTime();
            if (!ours && !free) return { taken: false, heldBy: row.holder };
            const fencing = ours ? row.fencing : row.fencing + 1;
            const changed = await trx('job_leases')
              .where({ name, holder: row.holder, fencing: row.fencing })
              .update({ holder, expires_at: expiresAt, fencing });
            if (changed !== 1) return { taken: false, heldBy: (await read(trx, name))?.holder ?? NO_HOLDER };
            return { taken: true, fencing };
          });
        });
      } catch (err) {
        if (isLockConflict(err)) return { taken: false, heldBy: CONTESTED };
        throw err;
      }
    },

    /**
     * The fencing write: in the caller's transaction `trx`, raises the lease row's `fenced_writes`
     * (and moves its expiry to at least `expiresAt`) only if `holder` still holds it with
     * `fencing`; returns false when it does not (the caller must then roll back). The row is
     * really changed, so on one node the transaction holds the row's lock until it ends (a
     * takeover waits for it, or it sees the takeover and fails here), and under Galera the row is
     * in the write set, so a takeover committed first on another node makes this commit fail
     * certification.
     */
    async fence(trx: DbOrTrx, name: string, holder: string, fencing: number, expiresAt: Date): Promise<boolean> {
      const changed = await trx('job_leases')
        .where({ name, holder, fencing })
        .update({ fenced_writes: trx.raw('fenced_writes + 1'), expires_at: trx.raw('GREATEST(expires_at, ?)', [expiresAt]) });
      return changed === 1;
    },

    /**
     * Moves the lease's expiry to `expiresAt` if `holder` still holds it with `fencing`.
     * Returns false when someone else has taken it since (the holder or the fencing differ).
     */
    async extend(name: string, holder: string, fencing: number, expiresAt: Date): Promise<boolean> {
      // one autocommit statement, so rerunning it after a lock conflict (a takeover committing at that moment) is safe
      const changed = await retryTransaction(() => db('job_leases').where({ name, holder, fencing }).update({ expires_at: expiresAt }));
      return changed === 1;
    },

    /**
     * Gives the lease up (nobody holds it, expired at once) if `holder` still holds it with
     * `fencing`; does nothing otherwise (it was taken over already). Returns whether it did.
     */
    async release(name: string, holder: string, fencing: number): Promise<boolean> {
      const changed = await db('job_leases')
        .where({ name, holder, fencing })
        .update({ holder: NO_HOLDER, expires_at: new Date(0) });
      return changed === 1;
    },
  };
}

export type JobLeasesRepo = ReturnType<typeof jobLeasesRepo>;
