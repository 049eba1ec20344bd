import { isLockConflict } from '../../db/db-errors.ts';

/**
 * Runs a transaction again (at most three times in all) when MariaDB rolled it back on a
 * deadlock or a lock wait timeout: the whole transaction was undone, so running it again is safe.
 */
export async function retryOnLockConflict<T>(run: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await run();
    } catch (err) {
      if (attempt < 3 && isLockConflict(err)) continue;
      throw err;
    }
  }
}
