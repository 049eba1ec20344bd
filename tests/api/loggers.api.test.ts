import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from '../support/factories.ts';

let t: TestApp;
let lab: TestLab;
let tech: string;
let guest: string;
beforeAll(async () => {
  t = await buildTestApp();
  lab = await buildLab(t.db);
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, lab, { role: 'technician' })).id);
  guest = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, lab, { role: 'guest' })).id);
});
afterAll(async () => t.close());

const base = () => `/api/v1/labs/${lab.slug}/loggers`;
let n = 0;
const loggerBody = (over: object = {}) => ({
  name: `Greenhouse ${++n}-${Date.now()}`,
  serial: 'GH-0042',
  site: 'Glasshouse 2',
  timezone: 'Europe/Berlin',
  expectedIntervalS: 300,
  channels: [
    { key: 'air_t', label: 'Air temperature', unit: '°C', quantity: 'temperature', validMin: -20, validMax: 50 },
    { key: 'rh', label: 'Relative humidity', unit: '%', validMin: 0, validMax: 100, seasonalPeriodHint: 288 },
  ],
  ...over,
});

describe('loggers and ingest keys', () => {
  it('registers a logger with channels; its key is shown once, works, and is stored only as a hash', async () => {
    const res = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody()).expect(201);
    const { logger, ingestKey } = res.body;
    expect(logger.channels.map((c: { key: string }) => c.key)).toEqual(['air_t', 'rh']);
    expect(ingestKey.key).toMatch(/^lbk_[0-9a-f]{12}_[A-Za-z0-9_-]{43}$/);
    expect(ingestKey.shownOnce).toBe(true);
    const row = await t.db('ingest_keys').where({ tenant_id: lab.id, logger_id: logger.id }).first();
    expect(row.key_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.stringify(row)).not.toContain(ingestKey.key.slice(17));
    const detail = await request(t.app).get(`${base()}/${logger.id}`).set('Cookie', tech).expect(200);
    expect(JSON.stringify(detail.body)).not.toContain(ingestKey.key);
    expect(detail.body.logger.keys).toEqual([expect.objectContaining({ prefix: ingestKey.prefix, revokedAt: null })]);
    const guestView = await request(t.app).get(`${base()}/${logger.id}`).set('Cookie', guest).expect(200);
    expect(guestView.body.logger.keys).toBeUndefined();
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${ingestKey.key}`)
      .send({ readings: [{ channel: 'rh', ts: Date.now(), value: 55 }] })
      .expect(200);
  });

  it('rotating keys stops the old key at once; revoking a key stops it; both are audit-logged', async () => {
    const { body } = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody()).expect(201);
    const old = body.ingestKey.key;
    const rotated = await request(t.app).post(`${base()}/${body.logger.id}/keys`).set('Cookie', tech).send({ rotate: true }).expect(201);
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${old}`).send({ readings: [] }).expect(401);
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${rotated.body.ingestKey.key}`).send({ readings: [] }).expect(200);
    await request(t.app).delete(`${base()}/${body.logger.id}/keys/${rotated.body.ingestKey.id}`).set('Cookie', tech).expect(204);
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${rotated.body.ingestKey.key}`).send({ readings: [] }).expect(401);
    const actions = (
      await t
        .db('audit_events')
        .where({ tenant_id: lab.id, target_id: String(body.logger.id) })
        .pluck('action')
    ).sort();
    expect(actions).toEqual(['ingest-key.revoked', 'ingest-key.rotated', 'logger.registered']);
  });

  it('retiring a logger keeps its readings and stops its keys', async () => {
    const { body } = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody()).expect(201);
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${body.ingestKey.key}`)
      .send({ readings: [{ channel: 'air_t', ts: Date.now() - 1000, value: 21 }] })
      .expect(200);
    await request(t.app).post(`${base()}/${body.logger.id}/retire`).set('Cookie', tech).expect(204);
    await request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${body.ingestKey.key}`).send({ readings: [] }).expect(401);
    const channelIds = body.logger.channels.map((c: { id: number }) => c.id);
    expect(await t.db('readings').where({ tenant_id: lab.id }).whereIn('channel_id', channelIds)).toHaveLength(1);
    const list = await request(t.app).get(base()).set('Cookie', tech).expect(200);
    expect(list.body.loggers.map((l: { id: number }) => l.id)).not.toContain(body.logger.id);
    const all = await request(t.app).get(`${base()}?includeRetired=true`).set('Cookie', tech).expect(200);
    expect(all.body.loggers.find((l: { id: number }) => l.id === body.logger.id).retiredAt).not.toBeNull();
  });

  it('edits loggers and channels; a retired channel quarantines new readings', async () => {
    const { body } = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody()).expect(201);
    const edited = await request(t.app).patch(`${base()}/${body.logger.id}`).set('Cookie', tech).send({ site: 'Glasshouse 3' }).expect(200);
    expect(edited.body.logger.site).toBe('Glasshouse 3');
    const rh = body.logger.channels.find((c: { key: string }) => c.key === 'rh');
    const ch = await request(t.app).patch(`${base()}/${body.logger.id}/channels/${rh.id}`).set('Cookie', tech).send({ validMax: 101 }).expect(200);
    expect(ch.body.channel.validMax).toBe(101);
    await request(t.app).post(`${base()}/${body.logger.id}/channels/${rh.id}/retire`).set('Cookie', tech).expect(204);
    const res = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${body.ingestKey.key}`)
      .send({ readings: [{ channel: 'rh', ts: Date.now(), value: 50 }] })
      .expect(200);
    expect(res.body.quarantined[0].code).toBe('retired_channel');
    const added = await request(t.app)
      .post(`${base()}/${body.logger.id}/channels`)
      .set('Cookie', tech)
      .send({ key: 'co2', label: 'CO2', unit: 'ppm' })
      .expect(201);
    expect(added.body.channel.key).toBe('co2');
  });

  it.each([
    [{ name: '' }, 'Name: must not be empty.', 'name'],
    [{ timezone: 'Mars/Olympus' }, "Logger's time zone: must be a time zone such as Europe/Berlin or UTC.", 'timezone'],
    [{ expectedIntervalS: 0 }, 'Expected time between readings: must be at least 1 second.', 'expectedIntervalS'],
    [
      { channels: [{ key: 'bad key', label: 'x' }] },
      'Channel key (1st channel): use 1 to 64 letters, digits, "_", "." or "-", starting with a letter or digit.',
      'channels.0.key',
    ],
    [
      { channels: [{ key: 'a', label: 'A', validMin: 5, validMax: 1 }] },
      'Highest valid value (1st channel): must be above the lowest valid value.',
      'channels.0.validMax',
    ],
    [
      {
        channels: [
          { key: 'a', label: 'A' },
          { key: 'a', label: 'B' },
        ],
      },
      'Channels: each channel of a logger needs its own channel key.',
      'channels',
    ],
  ])('refuses %j with 400, the message in plain words and the field by key', async (over, message, field) => {
    const res = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody(over)).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
    expect(res.body.error.fields.map((p: { field: string }) => p.field)).toEqual([field]);
  });

  it('refuses a duplicate logger name and a duplicate channel key with 409', async () => {
    const body = loggerBody();
    const { body: created } = await request(t.app).post(base()).set('Cookie', tech).send(body).expect(201);
    const dup = await request(t.app).post(base()).set('Cookie', tech).send(body).expect(409);
    expect(dup.body.error).toMatchObject({
      code: 'logger_name_taken',
      message: 'Name: this lab already has a logger with this name.',
      fields: [{ field: 'name' }],
    });
    const dupKey = await request(t.app).post(`${base()}/${created.logger.id}/channels`).set('Cookie', tech).send({ key: 'air_t', label: 'again' }).expect(409);
    expect(dupKey.body.error.code).toBe('channel_key_taken');
  });
});

describe('quarantine review', () => {
  it('lists with filters, exports CSV, discards, and re-submits fixed rows (which then count as stored)', async () => {
    const { body } = await request(t.app).post(base()).set('Cookie', tech).send(loggerBody()).expect(201);
    const key = body.ingestKey.key;
    const ts = Date.UTC(2026, 4, 1);
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${key}`)
      .send({
        readings: [
          { channel: 'air_t', ts, value: 'twenty, "one"' },
          { channel: 'air_tt', ts, value: 21 },
          { channel: 'air_t', ts: 'later', value: 22 },
        ],
      })
      .expect(200);
    const list = await request(t.app).get(`/api/v1/labs/${lab.slug}/quarantine?loggerId=${body.logger.id}`).set('Cookie', tech).expect(200);
    expect(list.body.total).toBe(3);
    const byReason = await request(t.app)
      .get(`/api/v1/labs/${lab.slug}/quarantine?loggerId=${body.logger.id}&reason=unknown_channel`)
      .set('Cookie', tech)
      .expect(200);
    expect(byReason.body.rows.map((r: { channel: string }) => r.channel)).toEqual(['air_tt']);

    const csv = await request(t.app).get(`/api/v1/labs/${lab.slug}/quarantine/export.csv?loggerId=${body.logger.id}`).set('Cookie', tech).expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\r\n');
    expect(lines[0]).toBe('id,logger_id,source,row_index,reason_code,reason,channel,ts,value,raw,received_at');
    expect(lines).toHaveLength(4);
    // RFC 4180 §2.7: a field with a comma or quotes is quoted, inner quotes doubled.
    expect(lines[1]).toContain(',"twenty, ""one""",');

    const badValue = list.body.rows.find((r: { reasonCode: string }) => r.reasonCode === 'bad_value');
    const unknown = list.body.rows.find((r: { reasonCode: string }) => r.reasonCode === 'unknown_channel');
    const badTime = list.body.rows.find((r: { reasonCode: string }) => r.reasonCode === 'bad_time');
    const fixed = await request(t.app)
      .post(`/api/v1/labs/${lab.slug}/quarantine/resubmit`)
      .set('Cookie', tech)
      .send({
        rows: [
          { id: badValue.id, channel: 'air_t', ts, value: 21.5 },
          { id: unknown.id, channel: 'air_t', ts: ts + 60_000, value: 'still bad' },
        ],
      })
      .expect(200);
    expect(fixed.body).toEqual({
      resubmitted: 2,
      accepted: 1,
      duplicates: 0,
      quarantined: [{ id: unknown.id, code: 'bad_value', reason: 'value: must be a finite number' }],
    });
    const discarded = await request(t.app)
      .post(`/api/v1/labs/${lab.slug}/quarantine/discard`)
      .set('Cookie', tech)
      .send({ ids: [badTime.id] })
      .expect(200);
    expect(discarded.body).toEqual({ discarded: 1 });
    const after = await request(t.app).get(`/api/v1/labs/${lab.slug}/quarantine?loggerId=${body.logger.id}`).set('Cookie', tech).expect(200);
    expect(after.body.rows.map((r: { reasonCode: string; source: string }) => [r.reasonCode, r.source])).toEqual([['bad_value', 'resubmit']]);
    const airT = body.logger.channels.find((c: { key: string }) => c.key === 'air_t');
    expect(await t.db('readings').where({ tenant_id: lab.id, channel_id: airT.id }).select('ts', 'value')).toEqual([{ ts, value: 21.5 }]);
  });

  it('refuses unknown ids with 404 and an empty selection with 400', async () => {
    await request(t.app)
      .post(`/api/v1/labs/${lab.slug}/quarantine/discard`)
      .set('Cookie', tech)
      .send({ ids: [123456789] })
      .expect(404);
    const res = await request(t.app).post(`/api/v1/labs/${lab.slug}/quarantine/discard`).set('Cookie', tech).send({ ids: [] }).expect(400);
    expect(res.body.error.message).toBe('Chosen rows: choose at least one row.');
  });
});
