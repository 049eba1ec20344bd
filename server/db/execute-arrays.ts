import type { Knex } from 'knex';

/** The part of a mysql2 connection used here (prepared statements, binary protocol). */
interface BinaryConnection {
  execute(options: { sql: string; rowsAsArray: boolean }, values: unknown[], cb: (err: Error | null, rows: unknown) => void): void;
}

/**
 * Runs a statement as a prepared statement and returns its rows as arrays. The binary protocol
 * sends a DOUBLE as its 8 bytes; MariaDB's text protocol (what knex queries use) prints it with
 * 15 significant digits, which rounds values such as 9.464301757086481 to 9.46430175708648.
 * Charts, exports and diagnostics must see the stored values exactly.
 */
export async function executeArrays(db: Knex, sql: string, values: unknown[]): Promise<unknown[][]> {
  const conn = (await db.client.acquireConnection()) as BinaryConnection;
  try {
    return await new Promise<unknown[][]>((resolve, reject) =>
      conn.execute({ sql, rowsAsArray: true }, values, (err, rows) => (err ? reject(err) : resolve(rows as unknown[][]))),
    );
  } finally {
    await db.client.releaseConnection(conn);
  }
}
