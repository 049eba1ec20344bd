import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';

/**
 * "Send a test reading" from a logger's page: one reading stored now through the logger's own
 * ingestion path and read back from the database; an unknown channel is quarantined (never
 * dropped) and the answer says why; only roles that manage loggers may send one, only in their lab.
 */
let t: TestApp;
let A: LabWithEverything;
let B: LabWithEverything;
let tech: string;
let guest: string;

beforeAll(async () => {
  t = await buildTestApp();
  A = await buildLabWithEverything(t.db, { name: 'Test Reading Lab A' });
  B = await buildLabWithEverything(t.db, { name: 'Test Reading Lab B' });
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, A.lab, { role: 'technician' })).id);
  guest = await sessionCookieFor(t.db, t.config.sessionSecret, A.guest.id);
});
afterAll(async () => t.close());

const route = (f: LabWithEverything, loggerId = f.ids.loggerId) => `/api/v1/labs/${f.lab.slug}/loggers/${loggerId}/test-reading`;

describe('POST /loggers/:loggerId/test-reading', () => {
  it('stores the reading now, reads the same value back from the database, and audit-logs it', async () => {
    const before = Date.now();
    const res = await request(t.app).post(route(A)).set('Cookie', tech).send({ channel: 'air_t', value: 21.37 }).expect(200);
    const after = Date.now();
    expect(res.body.sent).toEqual({ channel: 'air_t', ts: expect.any(String), value: 21.37 });
    const ts = Date.parse(res.body.sent.ts);
    expect(ts).toBeGreaterThanOrEqual(before);
    expect(ts).toBeLessThanOrEqual(after);
    expect(res.body.outcome).toEqual({ accepted: 1, duplicates: 0, quarantined: [] });
    expect(res.body.storedValue).toBe(21.37);
    expect(res.body.roundTripMs).toBeGreaterThan(0);
    expect(res.body.roundTripMs).toBeLessThan(after - before + 1);

    const row = await t.db('readings').where({ tenant_id: A.lab.id, channel_id: A.ids.channelId, ts }).first();
    expect(row.value).toBe(21.37);
    // Same path as a logger: the logger counts as seen, the channel's latest reading advances.
    const logger = await t.db('loggers').where({ tenant_id: A.lab.id, id: A.ids.loggerId }).first();
    expect(Number(logger.last_seen_at)).toBeGreaterThanOrEqual(before);
    const audit = await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'logger.test-reading', target_id: String(A.ids.loggerId) });
    expect(audit).toHaveLength(1);
  });

  it('quarantines a reading for a channel the logger does not have, says why, and stores nothing', async () => {
    const res = await request(t.app).post(route(A)).set('Cookie', tech).send({ channel: 'soil_q', value: 3 }).expect(200);
    expect(res.body.outcome.accepted).toBe(0);
    expect(res.body.outcome.quarantined).toEqual([{ index: 0, code: 'unknown_channel', reason: 'channel: no channel "soil_q" on this logger' }]);
    expect(res.body.storedValue).toBeNull();
    const kept = await t
      .db('quarantined_rows')
      .where({ tenant_id: A.lab.id, logger_id: A.ids.loggerId, reason_code: 'unknown_channel', channel_key: 'soil_q' });
    expect(kept).toHaveLength(1);
    expect(kept[0].source).toBe('api');
  });

  it('refuses a body that is not a channel key and a finite number, with field: reason', async () => {
    const cases: [object, string][] = [
      [{ channel: 'air_t', value: 'warm' }, 'value: must be a number'],
      [{ channel: '', value: 1 }, 'channel: use 1–64 letters, digits, "_", "." or "-", starting with a letter or digit'],
    ];
    for (const [body, message] of cases) {
      const res = await request(t.app).post(route(A)).set('Cookie', tech).send(body).expect(400);
      expect(res.body.error).toEqual(expect.objectContaining({ code: 'invalid_input', message }));
    }
  });

  it('refuses a guest (403) and answers 404 for another lab’s logger and for a logger that does not exist', async () => {
    const refused = await request(t.app).post(route(A)).set('Cookie', guest).send({ channel: 'air_t', value: 1 }).expect(403);
    expect(refused.body.error.code).toBe('forbidden');
    const foreign = await request(t.app).post(route(A, B.ids.loggerId)).set('Cookie', tech).send({ channel: 'air_t', value: 1 }).expect(404);
    expect(foreign.body.error.code).toBe('not_found');
    await request(t.app).post(route(A, 999_999_999_999)).set('Cookie', tech).send({ channel: 'air_t', value: 1 }).expect(404);
    // Nothing reached lab B's logger.
    expect(await t.db('readings').where({ tenant_id: B.lab.id, channel_id: B.ids.channelId })).toHaveLength(0);
  });

  it('refuses a retired logger (409) rather than storing into it', async () => {
    await request(t.app).post(`/api/v1/labs/${A.lab.slug}/loggers/${A.ids.loggerId}/retire`).set('Cookie', tech).expect(204);
    const res = await request(t.app).post(route(A)).set('Cookie', tech).send({ channel: 'air_t', value: 1 }).expect(409);
    expect(res.body.error.code).toBe('logger_retired');
  });
});
