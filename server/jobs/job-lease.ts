import { randomUUID } from 'node:crypto';
import { hostname } from 'node:os';
import type { Db } from '../db/create-db.ts';
import type { DbOrTrx } from '../db/tenant-scope.ts';
import { jobLeasesRepo, type TakeResult } from '../db/job-leases.repo.ts';
import { fullJitterDelayMs } from '../db/retry-transaction.ts';

/** Lease names in use; each names one piece of cluster-wide work. */
export const LEASE_NAMES = ['usage-reconciliation', 'storage-maintenance', 'retention', 'alert-evaluator'] as const;

/** Attempts to give a lease back after a run before leaving it to expire. */
const RELEASE_ATTEMPTS = 5;

/** A lease this holder has taken, handed to the work it guards. */
export interface HeldLease {
  readonly name: string;
  readonly holder: string;
  readonly fencing: number;
  /** Extends the lease; throws LeaseLostError when another holder has taken it. */
  renew(): Promise<void>;
  /** Throws LeaseLostError unless this holder still holds the lease with this fencing number. */
  assertHeld(): Promise<void>;
  /**
   * The fencing write, inside the caller's transaction `trx` (call it first in every transaction
   * the guarded work commits): changes the lease row only if this holder still holds it with this
   * fencing number, and extends it by the TTL; throws LeaseLostError otherwise, which rolls the
   * transaction back. Because the write lands in the same transaction, a takeover either waits for
   * this commit (one node: the row lock) or makes it fail (Galera: certification), never slips in
   * between a check and a commit as it could with {@link assertHeld}.
   */
  fence(trx: DbOrTrx): Promise<void>;
}

/** How `run` waits for a lease another holder has (default: it does not wait). */
export interface LeaseWait {
  /** Keep trying for about this many milliseconds of sleep before giving up (0: one attempt). */
  waitMs?: number;
  /** Mean pause between attempts; each pause is drawn from [0.5, 1.5) times it (default 100 ms). */
  pollMs?: number;
  /** A number in [0, 1) for the jitter (default Math.random). */
  random?: () => number;
  /** Waits `ms` milliseconds (default a timer; tests pass a recorder). */
  sleep?: (ms: number) => Promise<void>;
}

/** The lease has passed to another holder (or expired): the work must stop writing. */
export class LeaseLostError extends Error {
  constructor(
    readonly leaseName: string,
    readonly fencing: number,
  ) {
    super(`job lease ${leaseName} (fencing ${fencing}) is no longer held by this process`);
    this.name = 'LeaseLostError';
  }
}

/**
 * A holder name unique to this process: host, process id and a random part, so two processes on
 * one host (or a restarted process reusing a pid) never mistake each other's lease for their own.
 */
export function processHolderName(): string {
  return `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`.slice(0, 128);
}

/**
 * Runs cluster-wide jobs under leases kept in `job_leases`, so each runs on one app server at a
 * time however many are up. A lease is taken by an ordinary transaction (no `GET_LOCK`: named
 * locks are local to one node of a Galera cluster) for `ttlMs`; when the holder stops renewing
 * (it crashed, or hangs) another server takes it after expiry, with a higher fencing number, and
 * the stale holder's `renew`/`assertHeld` then throw {@link LeaseLostError}.
 *
 * Time comes from the injected `now` everywhere (expiry written and compared), never from the
 * database's clock: tests drive a simulated clock through it, and across servers the TTL is
 * chosen far above the drift of NTP-synchronised clocks.
 *
 * `assertHeld` is strict: a lease past its expiry counts as lost even before anyone takes it
 * (another server may take it at any moment), so work that can outlast its TTL calls `renew`
 * first. `renew` succeeds as long as nobody has taken the lease since (holder and fencing
 * unchanged), even just after expiry. Work longer than the TTL must renew on its way.
 *
 * `assertHeld` before a write leaves a gap: the lease can pass to another server between the check
 * and the commit. Work that must never commit after a takeover calls `fence(trx)` inside each of
 * its transactions instead (the alert evaluator does): the check becomes a write on the lease row
 * in the same transaction, ordered against the takeover by the row lock on one node and by
 * certification across a Galera cluster.
 */
export function createLeaseRunner(deps: { db: Db; holder: string; now?: () => Date }): {
  /**
   * Runs `work` only if this holder gets (or already holds) the lease `name` for `ttlMs`; releases
   * it after. With `wait`, a lease held by another is tried again after short jittered pauses
   * (so waiting servers do not retry in step) until `wait.waitMs` of pauses have passed.
   */
  run<T>(
    name: string,
    ttlMs: number,
    work: (lease: HeldLease) => Promise<T>,
    wait?: LeaseWait,
  ): Promise<{ ran: true; value: T } | { ran: false; heldBy: string }>;
} {
  const now = deps.now ?? (() => new Date());
  const repo = jobLeasesRepo(deps.db);
  const { holder } = deps;
  if (holder.length === 0 || holder.length > 128) throw new Error('createLeaseRunner: holder must be 1 to 128 characters');

  function heldLease(name: string, ttlMs: number, fencing: number): HeldLease {
    return {
      name,
      holder,
      fencing,
      async renew() {
        const extended = await repo.extend(name, holder, fencing, new Date(now().getTime() + ttlMs));
        if (!extended) throw new LeaseLostError(name, fencing);
      },
      async assertHeld() {
        const row = await repo.current(name);
        if (!row || row.holder !== holder || row.fencing !== fencing || row.expiresAt.getTime() <= now().getTime()) {
          throw new LeaseLostError(name, fencing);
        }
      },
      async fence(trx) {
        if (!(await repo.fence(trx, name, holder, fencing, new Date(now().getTime() + ttlMs)))) throw new LeaseLostError(name, fencing);
      },
    };
  }

  /**
   * Gives the lease back after a run. A lost lease is not ours to release (the conditional update
   * then changes nothing). The release is one idempotent statement, so when the database is briefly
   * unreachable (a cluster failing over to another node) it is tried again a few times, with
   * full-jitter back-off over about ten seconds: a run that ended during a failover would otherwise
   * leave the lease to expire, and every other server would skip the job until then.
   */
  async function releaseSoon(name: string, fencing: number): Promise<void> {
    for (let attempt = 1; attempt <= RELEASE_ATTEMPTS; attempt++) {
      try {
        await repo.release(name, holder, fencing);
        return;
      } catch {
        if (attempt < RELEASE_ATTEMPTS) await new Promise((resolve) => setTimeout(resolve, fullJitterDelayMs(attempt, 500, 4000, Math.random)));
      }
    }
  }

  /** Takes the lease, trying again after jittered pauses while another holds it, for up to `wait.waitMs` of pauses. */
  async function takeWaiting(name: string, ttlMs: number, wait: LeaseWait): Promise<TakeResult> {
    const waitMs = wait.waitMs ?? 0;
    const pollMs = wait.pollMs ?? 100;
    const random = wait.random ?? Math.random;
    const sleep = wait.sleep ?? ((ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms)));
    for (let slept = 0; ;) {
      const at = now();
      const got = await repo.take(name, holder, at, new Date(at.getTime() + ttlMs));
      if (got.taken || slept >= waitMs) return got;
      const pause = Math.min(waitMs - slept, pollMs * (0.5 + random()));
      await sleep(pause);
      slept += pause;
    }
  }

  return {
    async run(name, ttlMs, work, wait = {}) {
      if (!Number.isFinite(ttlMs) || ttlMs <= 0) throw new Error('createLeaseRunner.run: ttlMs must be a positive number of milliseconds');
      if (wait.waitMs !== undefined && !(wait.waitMs >= 0)) throw new Error('createLeaseRunner.run: waitMs must be zero or more milliseconds');
      const got = await takeWaiting(name, ttlMs, wait);
      if (!got.taken) return { ran: false, heldBy: got.heldBy };
      try {
        return { ran: true, value: await work(heldLease(name, ttlMs, got.fencing)) };
      } finally {
        await releaseSoon(name, got.fencing);
      }
    },
  };
}
