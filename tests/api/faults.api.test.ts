import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { testConfig } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { startAppProcess, stopAppProcess } from '../support/app-process.ts';
import { freePorts, startPrivateMariaDb, type PrivateMariaDb } from '../support/private-mariadb.ts';
import { T0, batchBody, newRecord, postBatch, postUntilAcknowledged, type PostingRecord } from '../support/posting-logger.ts';

/**
 * Faults around the database: MariaDB restarted while loggers post, a database that turns
 * read-only, and two app processes sharing one database. Each runs against real processes
 * (a private MariaDB for the first two, so stopping it disturbs nobody) and is bounded in time.
 */
const SECRET = 'fault-tests-session-secret-0123456789abcdef';

async function storedCount(db: Db, f: LabWithEverything): Promise<number> {
  const [{ n }] = await db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId }).count({ n: '*' });
  return Number(n);
}

async function distinctTimes(db: Db, f: LabWithEverything): Promise<number> {
  const [{ n }] = await db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId }).countDistinct({ n: 'ts' });
  return Number(n);
}

describe('on a private MariaDB', () => {
  let server: PrivateMariaDb;
  let db: Db;
  let app: Awaited<ReturnType<typeof startAppProcess>> | undefined;
  const fixtures: LabWithEverything[] = [];

  beforeAll(async () => {
    server = await startPrivateMariaDb('lagbook_fault');
    db = createDb(server.dbConfig);
    await migrateToLatest(db);
    for (let i = 0; i < 4; i++) fixtures.push(await buildLabWithEverything(db));
    app = await startAppProcess(server.dbConfig, freePorts(1)[0], SECRET);
  }, 60_000);

  afterAll(async () => {
    await stopAppProcess(app);
    await db?.destroy();
    await server?.destroy();
  }, 30_000);

  it('restarting MariaDB while loggers post: 503 with Retry-After, the app stays up, and every reading is stored exactly once', async () => {
    const LOGGERS = 3;
    const BATCHES = 30;
    const BATCH = 200;
    const deadline = Date.now() + 60_000;
    const records: PostingRecord[] = [];
    const loggers = fixtures.slice(0, LOGGERS).map(async (f) => {
      const record = newRecord();
      records.push(record);
      for (let b = 0; b < BATCHES; b++) await postUntilAcknowledged(app!.url, f.ingestKey, batchBody(b, BATCH), record, deadline);
    });

    // Let them get going, then take the database away for a while and bring it back.
    while (records.reduce((s, r) => s + r.acknowledged, 0) < 6 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    await server.stop();
    const outageStart = Date.now();
    let healthDuringOutage = 0;
    while (Date.now() - outageStart < 1500) {
      healthDuringOutage = (await fetch(`${app!.url}/healthz`)).status;
      await new Promise((r) => setTimeout(r, 250));
    }
    expect(app!.child.exitCode, 'the app process is still running during the outage').toBeNull();
    await server.start();
    const outcomes = await Promise.allSettled(loggers);
    expect(
      outcomes.flatMap((o) => (o.status === 'rejected' ? [(o.reason as Error).message] : [])),
      'loggers that got an answer other than 200 or 503',
    ).toEqual([]);

    const all = records.reduce(
      (acc, r) => ({ s503: acc.s503 + (r.statuses[503] ?? 0), noRetry: acc.noRetry + r.unavailableWithoutRetryAfter, net: acc.net + r.networkErrors }),
      { s503: 0, noRetry: 0, net: 0 },
    );
    expect(healthDuringOutage).toBe(503);
    expect(all.s503, 'loggers were told to come back later during the outage').toBeGreaterThan(0);
    expect(all.noRetry, '503 answers without Retry-After').toBe(0);
    expect(all.net, 'requests the app did not answer at all').toBe(0);
    for (const r of records) expect(Object.keys(r.statuses).sort()).toEqual(['200', '503']);
    for (const f of fixtures.slice(0, LOGGERS)) {
      expect(await storedCount(db, f)).toBe(BATCHES * BATCH);
      expect(await distinctTimes(db, f)).toBe(BATCHES * BATCH);
    }
    expect((await fetch(`${app!.url}/healthz`)).status).toBe(200);
  }, 90_000);

  it('a read-only database: ingestion answers 503 with a clear error, nothing is stored, and it recovers when writable again', async () => {
    // The app's user must not be able to write through read_only (SUPER or READ_ONLY ADMIN would).
    const grants = await server.asRoot("SHOW GRANTS FOR 'lagbook'@'127.0.0.1'");
    expect(grants).toContain('GRANT ALL PRIVILEGES ON `lagbook_fault`.*');
    expect(grants).not.toMatch(/SUPER|READ_ONLY ADMIN|ALL PRIVILEGES ON \*\.\*/);

    const f = fixtures[3];
    const body = batchBody(0, 100);
    await server.asRoot('SET GLOBAL read_only = 1');
    try {
      for (let i = 0; i < 3; i++) {
        const res = await postBatch(app!.url, f.ingestKey, body);
        expect(res.status).toBe(503);
        expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
        const json = (await res.json()) as { error: { code: string; message: string } };
        expect(json.error.code).toBe('service_unavailable');
        expect(json.error.message).toMatch(/read-only.*nothing was saved/i);
      }
      expect(app!.child.exitCode).toBeNull();
      expect(await storedCount(db, f)).toBe(0);
    } finally {
      await server.asRoot('SET GLOBAL read_only = 0');
    }
    const res = await postBatch(app!.url, f.ingestKey, body);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ accepted: 100, duplicates: 0, quarantined: [] });
    expect(await storedCount(db, f)).toBe(100);
  }, 60_000);
});

describe('two app processes on one database', () => {
  const config = testConfig();
  let db: Db;
  const apps: Array<Awaited<ReturnType<typeof startAppProcess>>> = [];

  beforeAll(async () => {
    db = createDb(config.db);
    await migrateToLatest(db);
    for (const port of freePorts(2)) apps.push(await startAppProcess(config.db, port, SECRET));
  }, 60_000);

  afterAll(async () => {
    for (const a of apps) a.child.kill('SIGTERM');
    await Promise.race([Promise.all(apps.map((a) => a.stopped)), new Promise((r) => setTimeout(r, 5000))]);
    for (const a of apps) if (a.child.exitCode === null) a.child.kill('SIGKILL');
    await db?.destroy();
  }, 30_000);

  it('a session works on both, and signing out through one ends it on the other', async () => {
    const f = await buildLabWithEverything(db);
    const person = await buildMember(db, f.lab, { role: 'scientist' });
    const cookie = await sessionCookieFor(db, SECRET, person.id);
    for (const a of apps) {
      const res = await fetch(`${a.url}/api/v1/me`, { headers: { cookie } });
      expect(res.status).toBe(200);
      expect(JSON.stringify(await res.json())).toContain(person.email);
      const channels = await fetch(`${a.url}/api/v1/labs/${f.lab.slug}/channels`, { headers: { cookie } });
      expect(channels.status).toBe(200);
    }
    const [first, second] = apps;
    const out = await fetch(`${first.url}/auth/sign-out`, { method: 'POST', headers: { cookie, origin: first.url } });
    expect(out.status).toBe(204);
    expect((await fetch(`${second.url}/api/v1/me`, { headers: { cookie } })).status).toBe(401);
  }, 60_000);

  it('an ingest key works on both, and a batch re-sent to the other process changes nothing', async () => {
    const f = await buildLabWithEverything(db);
    const post = (url: string, body: string) => postBatch(url, f.ingestKey, body);
    const [first, second] = apps;
    const a = await post(first.url, batchBody(0, 50));
    expect([a.status, await a.json()]).toEqual([200, { accepted: 50, duplicates: 0, quarantined: [] }]);
    const b = await post(second.url, batchBody(1, 50));
    expect([b.status, await b.json()]).toEqual([200, { accepted: 50, duplicates: 0, quarantined: [] }]);
    const again = await post(second.url, batchBody(0, 50));
    expect([again.status, await again.json()]).toEqual([200, { accepted: 0, duplicates: 50, quarantined: [] }]);
    const rows = await db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId }).orderBy('ts').select('ts');
    expect(rows.map((r: { ts: number }) => Number(r.ts))).toEqual(Array.from({ length: 100 }, (_, i) => T0 + i * 1000));
  }, 60_000);
});
