import knex, { type Knex } from 'knex';
import type { Config } from '../config.ts';

export type Db = Knex;

/**
 * Builds the Knex instance for MariaDB (mysql2 driver). BIGINT ids come back as numbers
 * while they fit, as strings beyond (supportBigNumbers); dates are read and written as UTC.
 * With `socketPath` (a server on the same machine) it connects through the Unix socket, which
 * skips the TCP stack on both sides: `npm run bench:ingest` spent less CPU per reading that way.
 * With `reader` (the LAGBOOK_DB_READ_* connection, see read-replica.ts) every session is READ ONLY
 * at REPEATABLE READ: a stray write fails there instead of landing on a replica, and a read
 * transaction sees one snapshot whatever isolation level the server defaults to.
 */
export function createDb(db: Config['db'], options: { reader?: boolean } = {}): Db {
  return knex({
    client: 'mysql2',
    connection: {
      ...(db.socketPath ? { socketPath: db.socketPath } : { host: db.host, port: db.port }),
      user: db.user,
      password: db.password,
      database: db.database,
      supportBigNumbers: true,
      bigNumberStrings: false,
      timezone: 'Z',
      dateStrings: false,
      charset: 'utf8mb4',
      connectTimeout: 5000,
    },
    pool: { min: 0, max: db.poolMax, ...(options.reader ? { afterCreate: asReaderSession } : {}) },
    acquireConnectionTimeout: 10_000,
  });
}

/** A pool connection as `afterCreate` receives it (mysql2's callback API). */
interface CallbackConnection {
  query(sql: string, cb: (err: Error | null) => void): void;
}

/** Makes a new reader connection read-only with snapshot reads (see createDb). */
function asReaderSession(conn: CallbackConnection, done: (err: Error | null, conn: CallbackConnection) => void): void {
  conn.query('SET SESSION TRANSACTION ISOLATION LEVEL REPEATABLE READ, READ ONLY', (err) => done(err, conn));
}

/** True when the database answers a trivial query within the pool's timeout. */
export async function databaseAnswers(db: Db): Promise<boolean> {
  try {
    await db.raw('SELECT 1');
    return true;
  } catch {
    return false;
  }
}
