import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { startAppProcess, stopAppProcess } from '../support/app-process.ts';
import { freePorts, startPrivateMariaDb, type PrivateMariaDb } from '../support/private-mariadb.ts';
import { batchBody, postBatch } from '../support/posting-logger.ts';

/**
 * A database that runs out of room. A private MariaDB keeps every table in the system
 * tablespace (`--innodb-file-per-table=0`) and caps that at 40 MB
 * (`--innodb-data-file-path=ibdata1:12M:autoextend:max:40M`), so InnoDB answers "the table is
 * full" (ER_RECORD_FILE_FULL) exactly as it does when the disk under it fills up. Loggers post
 * until that happens; the app must answer a clear 503 with Retry-After, keep every reading it
 * acknowledged, store nothing of the refused batch, stay up, and accept the batch once there
 * is room again.
 */
const SECRET = 'disk-full-tests-session-secret-0123456789abcdef';
const BATCH = 5000;

describe('a database that is full', () => {
  let server: PrivateMariaDb;
  let db: Db;
  let app: Awaited<ReturnType<typeof startAppProcess>> | undefined;
  let f: LabWithEverything;

  beforeAll(async () => {
    server = await startPrivateMariaDb('lagbook_full', { serverArgs: ['--innodb-file-per-table=0', '--innodb-data-file-path=ibdata1:12M:autoextend:max:40M'] });
    db = createDb(server.dbConfig);
    await migrateToLatest(db);
    f = await buildLabWithEverything(db);
    // Room an operator can give back later: 4 MB of ballast in the same tablespace.
    await server.asRoot(`CREATE TABLE lagbook_full.ballast (id INT PRIMARY KEY, pad CHAR(255) NOT NULL) ENGINE=InnoDB;
      SET SESSION max_recursive_iterations = 20000;
      INSERT INTO lagbook_full.ballast WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 16000) SELECT i, REPEAT('x', 255) FROM n;`);
    app = await startAppProcess(server.dbConfig, freePorts(1)[0], SECRET);
  }, 90_000);

  afterAll(async () => {
    await stopAppProcess(app);
    await db?.destroy();
    await server?.destroy();
  }, 30_000);

  const stored = async () => Number((await db('readings').where({ tenant_id: f.lab.id }).count({ n: '*' }))[0].n);

  it('answers 503 with Retry-After and a clear reason, keeps every acknowledged reading, stores nothing of the refused batch, and recovers', async () => {
    let acknowledged = 0;
    let refused: { batch: number; res: Response } | null = null;
    // 40 MB holds well under 2,000,000 readings (≈ 30 bytes of row data each plus page overhead).
    for (let b = 0; b < 400 && !refused; b++) {
      const res = await postBatch(app!.url, f.ingestKey, batchBody(b, BATCH));
      if (res.status === 200) acknowledged += ((await res.json()) as { accepted: number }).accepted;
      else refused = { batch: b, res };
    }
    expect(refused, 'the capped tablespace never filled').not.toBeNull();
    const { batch, res } = refused!;
    expect(res.status).toBe(503);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('service_unavailable');
    expect(body.error.message).toContain('no room left');
    expect(body.error.message).toContain('nothing was saved');
    expect(acknowledged).toBeGreaterThan(0);

    // Every acknowledged reading is there, and nothing of the refused batch.
    expect(await stored()).toBe(acknowledged);
    // The process is up and still answers.
    expect((await fetch(`${app!.url}/healthz`)).status).toBe(200);
    expect(app!.child.exitCode).toBeNull();

    // An operator frees room (here: drops the ballast); the same batch is then stored.
    await server.asRoot('DROP TABLE lagbook_full.ballast');
    const left = await stored();
    // InnoDB hands the dropped table's pages back in the background: retry as a logger would.
    let again = await postBatch(app!.url, f.ingestKey, batchBody(batch, BATCH));
    for (let i = 0; i < 60 && again.status === 503; i++) {
      await new Promise((r) => setTimeout(r, 500));
      again = await postBatch(app!.url, f.ingestKey, batchBody(batch, BATCH));
    }
    expect(again.status).toBe(200);
    expect(await again.json()).toEqual({ accepted: BATCH, duplicates: 0, quarantined: [] });
    expect(await stored()).toBe(left + BATCH);
  }, 180_000);
});
