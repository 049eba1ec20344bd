const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'PROTOCOL_CONNECTION_LOST', 'ER_SERVER_SHUTDOWN', 'ER_CON_COUNT_ERROR']);

/** True for errors that mean "the database is unreachable right now", not "the query is wrong". */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: string; name?: string } | null;
  if (!e) return false;
  // mysql2 marks a connection that died mid-transaction (e.g. the server restarting, the
  // ROLLBACK then failing with "connection is in closed state") as fatal without a code.
  return (e.code !== undefined && DB_DOWN_CODES.has(e.code)) || e.name === 'KnexTimeoutError' || (e as { fatal?: boolean }).fatal === true;
}

/** The server has no room for the write: its disk, or a capped tablespace, is full. */
export function isDatabaseFull(err: unknown): boolean {
  const code = (err as { code?: string } | null)?.code;
  return code === 'ER_RECORD_FILE_FULL' || code === 'ER_DISK_FULL';
}

/** The server refuses writes (read_only set, e.g. during maintenance or on a replica). */
export function isDatabaseReadOnly(err: unknown): boolean {
  return (err as { code?: string } | null)?.code === 'ER_OPTION_PREVENTS_STATEMENT';
}

/** A deadlock or lock wait timeout: the transaction was rolled back and can simply be retried. */
export function isLockConflict(err: unknown): boolean {
  const code = (err as { code?: string } | null)?.code;
  return code === 'ER_LOCK_DEADLOCK' || code === 'ER_LOCK_WAIT_TIMEOUT';
}
