import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Knex } from 'knex';
import express from 'express';
import { errorHandler } from '../../server/http/middleware/error-handler.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';

/**
 * Lock conflicts are retried as whole transactions (server/db/retry-transaction.ts), on the real
 * test MariaDB: a real deadlock inside an ingestion batch is retried and the batch is stored
 * exactly once; a conflict that outlasts every attempt answers 503 with Retry-After and stores
 * nothing. (A Galera certification failure reaches the app as the same error 1213 as the
 * deadlock provoked here; the cluster fault test exercises the real thing.)
 */
let t: TestApp;
let other: Db;
const BALLAST = 'certification_retry_ballast';
const BALLAST_ROWS = 5000;

beforeAll(async () => {
  t = await buildTestApp();
  other = createDb(t.config.db);
  await other.raw(`CREATE TABLE IF NOT EXISTS ${BALLAST} (id INT NOT NULL PRIMARY KEY, n INT NOT NULL) ENGINE=InnoDB`);
  await other(BALLAST).delete();
  for (let from = 1; from <= BALLAST_ROWS; from += 1000) {
    await other(BALLAST).insert(Array.from({ length: 1000 }, (_, i) => ({ id: from + i, n: 0 })));
  }
});
afterAll(async () => {
  await other?.raw(`DROP TABLE IF EXISTS ${BALLAST}`);
  await other?.destroy();
  await t?.close();
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** The stored readings and the channel's counters for the fixture channel. */
async function storedState(f: LabWithEverything) {
  const [{ n }] = await t.db('readings').where({ tenant_id: f.lab.id, channel_id: f.ids.channelId }).count({ n: '*' });
  const channel = await t.db('channels').where({ tenant_id: f.lab.id, id: f.ids.channelId }).first('stored_readings', 'data_version');
  return { readings: Number(n), storedReadings: Number(channel.stored_readings), dataVersion: Number(channel.data_version) };
}

/** Locks the fixture logger's row in a transaction of its own (as a conflicting writer on another connection would). */
async function holdLoggerRow(f: LabWithEverything): Promise<Knex.Transaction> {
  const trx = await other.transaction();
  await trx.raw('SELECT id FROM loggers WHERE tenant_id = ? AND id = ? FOR UPDATE', [f.lab.id, f.ids.loggerId]);
  return trx;
}

describe('certification conflicts and deadlocks are retried as whole transactions', () => {
  it('a real deadlock inside an ingestion batch: the batch is rolled back, run again, and stored exactly once', async () => {
    const f = await buildLabWithEverything(t.db);
    const before = await storedState(f);
    const t0 = Date.now() - 600_000;
    const rows = [0, 1, 2].map((i) => ({ index: i, channel: 'air_t', ts: t0 + i * 60_000, value: 4 + i }));

    // The conflicting writer changes every ballast row first (5,000 undo records), so when the
    // deadlock comes InnoDB rolls back the lighter transaction: the ingestion batch.
    const rival = await other.transaction();
    await rival(BALLAST).update({ n: rival.raw('n + 1') });
    let attempts = 0;
    let rivalDone: Promise<unknown> = Promise.resolve();
    const outcome = await ingestBatch(t.db, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, rows, {
      source: 'api',
      hooks: {
        async beforeCommit(trx) {
          attempts++;
          if (attempts > 1) return;
          // the batch holds the logger row; the rival now waits for it …
          rivalDone = rival.raw('SELECT id FROM loggers WHERE tenant_id = ? AND id = ? FOR UPDATE', [f.lab.id, f.ids.loggerId]).then(
            () => rival.rollback(),
            () => rival.rollback(),
          );
          await sleep(200);
          // … and the batch asks for a row the rival holds: a cycle, so InnoDB aborts one of them
          await trx.raw(`SELECT n FROM ${BALLAST} WHERE id = 1 FOR UPDATE`);
        },
      },
    });
    await rivalDone;
    expect(attempts).toBe(2); // the deadlock victim was the batch, and it ran again
    expect(outcome).toMatchObject({ accepted: 3, duplicates: 0, quarantined: [] });
    const after = await storedState(f);
    expect(after.readings - before.readings).toBe(3);
    expect(after.storedReadings - before.storedReadings).toBe(3);
    expect(after.dataVersion - before.dataVersion).toBe(1);
    expect(Number((await other(BALLAST).sum({ s: 'n' }))[0].s)).toBe(0); // the rival's change was rolled back whole too
  });

  it('a conflict on every attempt: POST /api/v1/ingest answers 503 with Retry-After, stores nothing, and the logger’s resend is stored once', async () => {
    const f = await buildLabWithEverything(t.db);
    const before = await storedState(f);
    // Every connection of the app's pool gives up a lock wait after 1 s instead of 50 s (a
    // session setting: the server's global one is left alone), so each attempt ends in a lock
    // wait timeout (1205) behind the held logger row.
    const conns = await Promise.all(Array.from({ length: t.config.db.poolMax }, () => t.db.client.acquireConnection()));
    try {
      for (const conn of conns) await t.db.raw('SET SESSION innodb_lock_wait_timeout = 1').connection(conn);
    } finally {
      for (const conn of conns) await t.db.client.releaseConnection(conn);
    }
    const holder = await holdLoggerRow(f);
    const ts = Date.now() - 120_000;
    const body = { readings: [0, 1, 2, 3].map((i) => ({ channel: 'air_t', ts: ts + i * 1000, value: 10 + i })) };
    const started = Date.now();
    let res: request.Response;
    try {
      res = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send(body);
    } finally {
      await holder.rollback();
    }
    const tookMs = Date.now() - started;
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe('1');
    expect(res.body.error.code).toBe('service_unavailable');
    expect(res.body.error.message).toMatch(/nothing was saved/);
    expect(tookMs).toBeGreaterThanOrEqual(4000); // four attempts of one second each, not one
    expect(await storedState(f)).toEqual(before);

    const resent = await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send(body).expect(200);
    expect(resent.body).toMatchObject({ accepted: 4, duplicates: 0 });
    const after = await storedState(f);
    expect(after.readings - before.readings).toBe(4);
    expect(after.storedReadings - before.storedReadings).toBe(4);
  });

  it('what the database says during a failover answers 503 with Retry-After, never 500', async () => {
    const cases = [
      { code: 'ER_UNKNOWN_COM_ERROR', errno: 1047, message: 'WSREP has not yet prepared node for application use', retryAfter: '2' },
      { code: 'ER_LOCK_DEADLOCK', errno: 1213, message: 'Deadlock found when trying to get lock; try restarting transaction', retryAfter: '1' },
      { code: 'ER_LOCK_WAIT_TIMEOUT', errno: 1205, message: 'Lock wait timeout exceeded; try restarting transaction', retryAfter: '1' },
      { code: 'PROTOCOL_CONNECTION_LOST', errno: undefined, message: 'Connection lost: The server closed the connection.', retryAfter: '5' },
    ];
    for (const c of cases) {
      const app = express();
      app.get('/x', () => {
        throw Object.assign(new Error(c.message), { code: c.code, errno: c.errno });
      });
      app.use(errorHandler(createLogWriter({ silent: true })));
      const res = await request(app).get('/x');
      expect([c.code, res.status, res.headers['retry-after'], res.body.error.code]).toEqual([c.code, 503, c.retryAfter, 'service_unavailable']);
      expect(res.body.error.message).not.toMatch(/WSREP|Deadlock|ER_/); // plain words, no internals
    }
  });
});
