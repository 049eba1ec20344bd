const DB_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'PROTOCOL_CONNECTION_LOST',
  'ER_SERVER_SHUTDOWN',
  'ER_CON_COUNT_ERROR',
  'ER_OPTION_PREVENTS_STATEMENT',
]);

/** True for errors that mean "the database is unreachable right now", not "the query is wrong". */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: string; name?: string } | null;
  if (!e) return false;
  return (e.code !== undefined && DB_DOWN_CODES.has(e.code)) || e.name === 'KnexTimeoutError';
}

/** A deadlock or lock wait timeout: the transaction was rolled back and can simply be retried. */
export function isLockConflict(err: unknown): boolean {
  const code = (err as { code?: string } | null)?.code;
  return code === 'ER_LOCK_DEADLOCK' || code === 'ER_LOCK_WAIT_TIMEOUT';
}
