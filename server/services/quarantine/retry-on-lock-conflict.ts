import { retryTransaction } from '../../db/retry-transaction.ts';

/**
 * The quarantine's whole-transaction retry, now the shared one: runs `run` (one complete
 * transaction) again with jittered back-off when MariaDB or Galera rolled it back on a lock
 * conflict (see {@link retryTransaction}, which says why that is safe). Kept under this name so
 * its callers (`quarantine.service.ts`, `bulk-runs.ts`) need no change; new code calls
 * `retryTransaction` directly.
 */
export function retryOnLockConflict<T>(run: () => Promise<T>): Promise<T> {
  return retryTransaction(run);
}
