import type { Db } from '../../db/create-db.ts';

/**
 * Prefix of the MariaDB named lock that lets one alert evaluator run at a time across all app
 * processes. Named locks are global to the server, so the database name is appended: two
 * Lagbook databases on one server (say staging and production) do not wait for each other.
 */
export const EVALUATOR_LOCK = 'lagbook.alert-evaluator.';

interface RawConnection {
  query(sql: string, values: unknown[], cb: (err: Error | null, rows: unknown) => void): void;
}

const ask = (conn: RawConnection, sql: string, values: unknown[]) =>
  new Promise<Array<Record<string, unknown>>>((resolve, reject) =>
    conn.query(sql, values, (err, rows) => (err ? reject(err) : resolve(rows as Array<Record<string, unknown>>))),
  );

/**
 * Runs `work` while holding MariaDB's named lock {@link EVALUATOR_LOCK}+database (GET_LOCK /
 * RELEASE_LOCK), taken on one dedicated pooled connection that is kept for the whole run: a
 * named lock belongs to the session that took it, and MariaDB frees it if that session dies,
 * so a crashed process never leaves the lock behind. Waits up to `waitS` seconds for another
 * evaluator to finish; returns `{ ran: false }` if it does not. The work itself uses other
 * connections (the lock guards no rows; the per-rule transactions and unique keys do).
 */
export async function withEvaluatorLock<T>(db: Db, waitS: number, work: () => Promise<T>): Promise<{ ran: true; result: T } | { ran: false }> {
  const conn = (await db.client.acquireConnection()) as RawConnection;
  try {
    const [row] = await ask(conn, 'SELECT GET_LOCK(CONCAT(?, DATABASE()), ?) AS got', [EVALUATOR_LOCK, waitS]);
    if (Number(row?.got) !== 1) return { ran: false };
    try {
      return { ran: true, result: await work() };
    } finally {
      await ask(conn, 'SELECT RELEASE_LOCK(CONCAT(?, DATABASE()))', [EVALUATOR_LOCK]).catch(() => undefined);
    }
  } finally {
    await db.client.releaseConnection(conn);
  }
}
