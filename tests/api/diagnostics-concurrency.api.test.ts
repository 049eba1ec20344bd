/**
 * The per-person cap on diagnostics runs in flight (#15 finding 12), on the real MariaDB: the
 * engine runs on a stand-in worker pool that holds every task until the test lets it finish
 * (then computes it with the real engine), so "two runs still running" is a state the test
 * controls, not a matter of timing. The readings are simulated (behaviour checks only).
 */
import { createServer, get as httpGet } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, standInAppDeps } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createApp } from '../../server/app.ts';
import type { AnalysisPool } from '../../server/workers/analysis-pool.ts';
import { channelDiagnostics } from '../../server/analysis/index.ts';

const STEP = 600_000;
const N = 288; // two days of 10-minute readings

let t: TestApp;
let f: LabWithEverything;
let app: Express;
let soilId: number;
let from: number;
/** Engine tasks the stand-in pool holds, in the order they arrived. */
const held: Array<{ finish: () => void }> = [];

/** Engine tasks cancelled because their client went away (the route aborts them). */
let aborted = 0;

const heldPool: AnalysisPool = {
  run: (task, options) =>
    new Promise((resolve, reject) => {
      options?.signal?.addEventListener('abort', () => {
        aborted++;
        reject(Object.assign(new Error('aborted'), { name: 'AbortError' }));
      });
      held.push({
        finish: () => {
          try {
            resolve(channelDiagnostics(...(task.args as Parameters<typeof channelDiagnostics>)) as never);
          } catch (err) {
            reject(err);
          }
        },
      });
    }),
  close: async () => {},
};

async function until(what: string, check: () => boolean): Promise<void> {
  for (const give = Date.now() + 10_000; !check();) {
    if (Date.now() > give) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 10));
  }
}

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  soilId = f.ids.channelId + 1;
  await t.db('channels').insert({ tenant_id: f.lab.id, id: soilId, logger_id: f.ids.loggerId, channel_key: 'soil_m', label: 'Soil moisture', unit: '%' });
  from = Math.floor((Date.now() - (N + 6) * STEP) / STEP) * STEP;
  const readings = Array.from({ length: N }, (_, i) => [
    { channel: 'air_t', ts: from + i * STEP, value: 12 + 5 * Math.sin((2 * Math.PI * i) / 144) + (i % 7) / 10 },
    { channel: 'soil_m', ts: from + i * STEP, value: 30 + Math.cos((2 * Math.PI * i) / 144) + (i % 5) / 10 },
  ]).flat();
  await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings }).expect(200);
  app = createApp(standInAppDeps(t, { analysisPool: heldPool }));
});
afterAll(async () => {
  for (const h of held.splice(0)) h.finish();
  await t.close();
});

/** A diagnostics request; `maxLag` differs per call so none is answered from the cache. */
const diagnostics = (cookie: string, channelId: number, maxLag: number) =>
  request(app)
    .get(`/api/v1/labs/${f.lab.slug}/channels/${channelId}/diagnostics?from=${from}&to=${from + N * STEP}&step=600&maxLag=${maxLag}`)
    .set('Cookie', cookie);

describe('diagnostics runs in flight per person', () => {
  it('refuses a third run of one person with 429 and Retry-After naming what runs, while another person is served', async () => {
    expect(t.config.diagnostics.runsPerPerson).toBe(2);
    const scientist = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'scientist' })).id);
    const guest = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);

    const first = diagnostics(guest, f.ids.channelId, 12).then((r) => r);
    await until('the first engine task', () => held.length === 1);
    const second = diagnostics(guest, soilId, 13).then((r) => r);
    await until('the second engine task', () => held.length === 2);

    const third = await diagnostics(guest, f.ids.channelId, 14).expect(429);
    expect(third.headers['retry-after']).toBe('5');
    expect(third.body.error).toEqual({
      code: 'diagnostics_busy',
      message: "2 diagnostics runs of yours are still running (channel 'Air temperature', channel 'Soil moisture'); try again when one finishes.",
    });
    expect(held).toHaveLength(2); // the refused run never reached the engine

    // Someone else's run is not held back by the guest's two.
    const theirs = diagnostics(scientist, f.ids.channelId, 15).then((r) => r);
    await until("the scientist's engine task", () => held.length === 3);
    held[2].finish();
    expect((await theirs).status).toBe(200);

    // One of the guest's runs finishes: their next one is accepted.
    held[0].finish();
    expect((await first).status).toBe(200);
    const fourth = diagnostics(guest, f.ids.channelId, 16).then((r) => r);
    await until("the guest's next engine task", () => held.length === 4);
    held[1].finish();
    held[3].finish();
    expect((await second).status).toBe(200);
    expect((await fourth).status).toBe(200);
  });

  it('is documented: 429 with Retry-After on both diagnostics routes', async () => {
    const doc = (await request(app).get('/api/v1/openapi.json').expect(200)).body;
    for (const path of ['/api/v1/labs/{lab}/channels/{channelId}/diagnostics', '/api/v1/labs/{lab}/channels/{channelId}/diagnostics.csv']) {
      const busy = doc.paths[path].get.responses['429'];
      expect(busy.description).toMatch(/^`diagnostics_busy`: /);
      expect(Object.keys(busy.headers)).toEqual(['Retry-After']);
      expect(busy.content['application/json'].schema).toEqual({ $ref: '#/components/schemas/Error' });
    }
  });

  it('gives the slot back when the client of a run goes away (its engine task is aborted)', async () => {
    const guest = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);
    const server = createServer(app);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    try {
      const { port } = server.address() as AddressInfo;
      const before = held.length;
      const leaving = httpGet({
        host: '127.0.0.1',
        port,
        path: `/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}/diagnostics?from=${from}&to=${from + N * STEP}&step=600&maxLag=18`,
        headers: { cookie: guest },
      });
      leaving.on('error', () => {});
      await until('the leaving run', () => held.length === before + 1);
      const staying = diagnostics(guest, soilId, 19).then((r) => r);
      await until('the staying run', () => held.length === before + 2);
      await diagnostics(guest, f.ids.channelId, 20).expect(429);

      const abortedBefore = aborted;
      leaving.destroy();
      await until('the abort', () => aborted === abortedBefore + 1);
      // The freed slot takes the next run (a 429 here only means the release has not run yet).
      let next: Promise<request.Response> | undefined;
      for (const give = Date.now() + 5_000; held.length === before + 2;) {
        if (Date.now() > give) throw new Error('the slot was not given back');
        const attempt = diagnostics(guest, f.ids.channelId, 21).then((r) => r);
        let outcome: number | 'started' | undefined;
        void attempt.then((r) => (outcome ??= r.status));
        await until('the next run to start or be refused', () => {
          if (held.length === before + 3) outcome ??= 'started';
          return outcome !== undefined;
        });
        if (outcome === 'started') next = attempt;
        else expect(outcome).toBe(429);
      }
      held[before + 1].finish();
      held[before + 2].finish();
      expect((await staying).status).toBe(200);
      expect((await next!).status).toBe(200);
    } finally {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
    }
  });

  it('gives the slot back when a run is refused by the engine or the channel does not exist', async () => {
    const guest = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);
    // An empty range: the service refuses it (422) before the engine; twice, more than the cap allows at once.
    const empty = (maxLag: number) =>
      request(app)
        .get(
          `/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}/diagnostics?from=${from - 10 * N * STEP}&to=${from - 9 * N * STEP}&step=600&maxLag=${maxLag}`,
        )
        .set('Cookie', guest);
    for (const lag of [12, 13, 14]) await empty(lag).expect(422);
    for (let i = 0; i < 3; i++) await diagnostics(guest, soilId + 1_000_000, 12).expect(404);
    const before = held.length;
    const run = diagnostics(guest, f.ids.channelId, 17).then((r) => r);
    await until('the engine task', () => held.length === before + 1);
    held[before].finish();
    expect((await run).status).toBe(200);
  });
});
