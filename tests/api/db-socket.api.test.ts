import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { readingsRepo, type ReadingBatchColumns } from '../../server/db/readings.repo.ts';
import { testConfig } from '../support/test-app.ts';
import { buildLabWithEverything } from '../support/lab-fixture.ts';

/**
 * `npm start` runs the server on MariaDB's Unix socket (LAGBOOK_DB_SOCKET); the rest of the suite
 * uses TCP. This checks the socket path end to end on the test server: the account it signs in
 * as, and a batch streamed with LOAD DATA LOCAL INFILE over it.
 */
const config = testConfig();
const socketPath = join(process.env.LAGBOOK_DB_DIR!, 'mysqld.sock');
let db: Db;

afterAll(async () => {
  await db?.destroy();
});

describe('database over the Unix socket', () => {
  it('signs in as the socket account and stores readings with LOAD DATA on it', async () => {
    db = createDb({ ...config.db, socketPath });
    const [[who]] = (await db.raw('SELECT CURRENT_USER() AS account')) as unknown as [[{ account: string }]];
    expect(who.account).toBe('lagbook@localhost');

    const { lab, ids } = await buildLabWithEverything(db);
    const rows: ReadingBatchColumns = {
      length: 3,
      channelId: new Float64Array(3).fill(ids.channelId),
      ts: Float64Array.of(1000, 2000, 3000),
      value: Float64Array.of(1.5, -2.25, 0.1),
    };
    const inserted = await db.transaction((trx) => readingsRepo(inLab(trx, lab.id)).insertNew(rows));
    expect(inserted).toBe(3);
    const stored = await db('readings').where({ tenant_id: lab.id, channel_id: ids.channelId }).orderBy('ts').select('ts', 'value');
    expect(stored.map((r) => [Number(r.ts), r.value])).toEqual([
      [1000, 1.5],
      [2000, -2.25],
      [3000, 0.1],
    ]);
  });
});
