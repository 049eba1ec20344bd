import { isLockConflict } from './db-errors.ts';

/** How a conflicting transaction is run again (every field optional; the defaults suit a request). */
export interface RetryOptions {
  /** Attempts in all, the first included (default {@link DEFAULT_ATTEMPTS}). */
  attempts?: number;
  /** Upper bound of the first wait in milliseconds; it doubles per attempt (default 25). */
  baseMs?: number;
  /** No wait is ever longer than this, in milliseconds (default 1,000). */
  capMs?: number;
  /** A number in [0, 1): `Math.random` by default, a fixed sequence in tests. */
  random?: () => number;
  /** Waits `ms` milliseconds: a timer by default, a recorder in tests. */
  sleep?: (ms: number) => Promise<void>;
  /** Told of each conflict that is about to be retried (for logs and tests). */
  onRetry?: (attempt: number, waitMs: number, err: unknown) => void;
  /**
   * Which errors are retried (default {@link isLockConflict}). A caller whose `run` is safe to
   * repeat even when an earlier attempt may have committed (one idempotent statement) may widen it,
   * e.g. to ride out a database failover.
   */
  retryWhen?: (err: unknown) => boolean;
}

/** Attempts in all when a caller does not say: enough to ride out a burst of conflicts, few enough to answer within a second or two. */
export const DEFAULT_ATTEMPTS = 4;

const wait = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * Full-jitter exponential back-off: the wait before retry number `attempt` (1 for the first retry)
 * is drawn uniformly from [0, min(capMs, baseMs · 2^(attempt−1))). Drawing the whole interval
 * (rather than adding a little noise to a fixed delay) spreads writers that collided at one moment
 * so they do not collide again in step. Source: Marc Brooker, "Exponential Backoff And Jitter",
 * AWS Architecture Blog, 2015 ("Full Jitter").
 */
export function fullJitterDelayMs(attempt: number, baseMs: number, capMs: number, random: () => number): number {
  if (!Number.isInteger(attempt) || attempt < 1) throw new Error('fullJitterDelayMs: attempt must be a whole number from 1');
  const ceiling = Math.min(capMs, baseMs * 2 ** (attempt - 1));
  return Math.floor(random() * ceiling);
}

/**
 * Runs `run` — which must open, do and commit one whole transaction — and runs it again when the
 * database rolled it back on a lock conflict ({@link isLockConflict}): a deadlock (1213, which is
 * also what a Galera cluster raises when certification refuses a commit because another node
 * changed the same rows first, or when a replicated write aborts a local one) or a lock wait
 * timeout (1205). At most `attempts` runs, with {@link fullJitterDelayMs} between them; any other
 * error, and the last conflict, reach the caller at once (the error handler turns a conflict into
 * 503 with Retry-After).
 *
 * Retrying is safe only because nothing of the failed attempt survives: a deadlock rolls the whole
 * transaction back, and for a lock wait timeout (which undoes only the statement) knex's
 * `db.transaction(…)` rolls back the rest when the error leaves its callback. Never wrap part of a
 * transaction, or a `run` that writes outside one (those writes would happen twice), or a `run` that
 * has effects beyond the database before its commit (mail, HTTP calls).
 */
export async function retryTransaction<T>(run: () => Promise<T>, opts: RetryOptions = {}): Promise<T> {
  const attempts = opts.attempts ?? DEFAULT_ATTEMPTS;
  if (!Number.isInteger(attempts) || attempts < 1) throw new Error('retryTransaction: attempts must be a whole number from 1');
  const baseMs = opts.baseMs ?? 25;
  const capMs = opts.capMs ?? 1000;
  const random = opts.random ?? Math.random;
  const sleep = opts.sleep ?? wait;
  for (let attempt = 1; ; attempt++) {
    try {
      return await run();
    } catch (err) {
      if (attempt >= attempts || !(opts.retryWhen ?? isLockConflict)(err)) throw err;
      const ms = fullJitterDelayMs(attempt, baseMs, capMs, random);
      opts.onRetry?.(attempt, ms, err);
      await sleep(ms);
    }
  }
}
