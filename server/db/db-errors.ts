const DB_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'PROTOCOL_CONNECTION_LOST',
  'ER_SERVER_SHUTDOWN',
  'ER_CON_COUNT_ERROR',
  // 1927: the server ended this session (an operator, or a cluster node leaving and cutting its clients)
  'ER_CONNECTION_KILLED',
  // 1180: a commit that failed inside the server; under Galera a node that lost the primary
  // component answers COMMIT this way (from memory of Galera's behaviour, not reproduced here)
  'ER_ERROR_DURING_COMMIT',
]);

/**
 * MariaDB error 1047 (`ER_UNKNOWN_COM_ERROR`): on a Galera node it means "WSREP has not yet
 * prepared node for application use" — the node has left the primary component (its peers are
 * gone, or it is still joining) and refuses every query until it is synced again. The load
 * balancer moves new connections to a healthy node; this one's request is answered 503.
 */
export function isNodeNotReady(err: unknown): boolean {
  const e = err as { code?: string; errno?: number } | null;
  return e?.code === 'ER_UNKNOWN_COM_ERROR' || e?.errno === 1047;
}

/**
 * True for errors that mean "the database is unreachable right now", not "the query is wrong":
 * a refused or lost connection, a full connection pool, a server shutting down, or a cluster
 * node that is not ready ({@link isNodeNotReady}).
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: string; name?: string } | null;
  if (!e) return false;
  // mysql2 marks a connection that died mid-transaction (e.g. the server restarting, the
  // ROLLBACK then failing with "connection is in closed state") as fatal without a code.
  return (e.code !== undefined && DB_DOWN_CODES.has(e.code)) || e.name === 'KnexTimeoutError' || (e as { fatal?: boolean }).fatal === true || isNodeNotReady(e);
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

/**
 * A deadlock (1213) or lock wait timeout (1205): the transaction can be run again as a whole
 * (`retry-transaction.ts`), and what still fails is "busy, try again" (503), never a bug. Under
 * Galera 1213 is also a certification failure (another node committed a change to the same rows
 * first) or a brute-force abort of a local transaction by a replicated one.
 */
export function isLockConflict(err: unknown): boolean {
  const e = err as { code?: string; errno?: number } | null;
  return e?.code === 'ER_LOCK_DEADLOCK' || e?.code === 'ER_LOCK_WAIT_TIMEOUT' || e?.errno === 1213 || e?.errno === 1205;
}
