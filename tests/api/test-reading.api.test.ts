import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, standInAppDeps } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createApp } from '../../server/app.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer } from '../../server/integrations/mail/create-mailer.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';

/**
 * "Send a test reading" from a logger's page: the row gets ingestion's own checks (the answer
 * says what a logger's reading would get), but it is kept in `test_readings`, never in
 * `readings`, `reading_rollups` or `quarantined_rows`, so series, diagnostics and alerts do not
 * see it. Values outside the channel's valid range need a confirmation; the sender may remove
 * a test reading for 10 minutes of the service clock, which this file moves.
 */
let t: TestApp;
let app: Express;
let clock = Date.UTC(2026, 10, 24, 12, 0, 0);
const undocumented: string[] = [];
let A: LabWithEverything;
let B: LabWithEverything;
let tech: string;
let techId: number;
let otherTech: string;
let guest: string;
let scientist: string;

beforeAll(async () => {
  t = await buildTestApp();
  // the real app on a movable service clock, still failing on statuses its route table does not document
  app = createApp(standInAppDeps(t, { now: () => new Date(clock), onUndocumentedStatus: (where, status) => undocumented.push(`${where} answered ${status}`) }));
  A = await buildLabWithEverything(t.db, { name: 'Test Reading Lab A' });
  B = await buildLabWithEverything(t.db, { name: 'Test Reading Lab B' });
  const techUser = await buildMember(t.db, A.lab, { role: 'technician', displayName: 'Tove Technician' });
  techId = techUser.id;
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, techUser.id);
  otherTech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, A.lab, { role: 'technician' })).id);
  scientist = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, A.lab, { role: 'scientist' })).id);
  guest = await sessionCookieFor(t.db, t.config.sessionSecret, A.guest.id);
});
afterAll(async () => {
  await t.close();
  expect(undocumented).toEqual([]);
});

const base = (f: LabWithEverything) => `/api/v1/labs/${f.lab.slug}`;
const route = (f: LabWithEverything, loggerId = f.ids.loggerId) => `${base(f)}/loggers/${loggerId}/test-reading`;
const removal = (f: LabWithEverything, id: number, loggerId = f.ids.loggerId) => `${base(f)}/loggers/${loggerId}/test-readings/${id}`;
const send = (cookie: string, body: object, f = A) => request(app).post(route(f)).set('Cookie', cookie).send(body);
const countRows = async (table: string, where: Record<string, unknown>) => Number((await t.db(table).where(where).count({ n: '*' }))[0].n);

/** A channel with a valid range on A's logger, made through the API. */
async function rangedChannel(key: string, label: string, validMin: number, validMax: number): Promise<number> {
  const founder = await sessionCookieFor(t.db, t.config.sessionSecret, A.founder.id);
  const res = await request(app)
    .post(`${base(A)}/loggers/${A.ids.loggerId}/channels`)
    .set('Cookie', founder)
    .send({ key, label, unit: '°C', validMin, validMax })
    .expect(201);
  return res.body.channel.id;
}

describe('POST /loggers/:loggerId/test-reading', () => {
  it('keeps the reading in test_readings (source test), not in readings, rollups or quarantine, says a logger’s reading would be stored, and audit-logs it', async () => {
    clock += 60_000;
    const rollupsBefore = await countRows('reading_rollups', { tenant_id: A.lab.id, channel_id: A.ids.channelId });
    const quarantinedBefore = await countRows('quarantined_rows', { tenant_id: A.lab.id });
    const res = await send(tech, { channel: 'air_t', value: 21.37 }).expect(200);
    expect(res.body.sent).toEqual({ channel: 'air_t', ts: new Date(clock).toISOString(), value: 21.37 });
    expect(res.body.wouldGet).toEqual({ outcome: 'stored' });
    expect(res.body.timezone).toBe('UTC');
    expect(res.body.testReading).toEqual({
      id: expect.any(Number),
      source: 'test',
      loggerId: A.ids.loggerId,
      channelId: A.ids.channelId,
      channel: 'air_t',
      ts: clock,
      time: new Date(clock).toISOString(),
      value: 21.37,
      outsideRange: false,
      sentBy: { id: techId, name: 'Tove Technician' },
      sentAt: new Date(clock).toISOString(),
      removableUntil: new Date(clock + 600_000).toISOString(),
      removableByYouForMs: 600_000,
    });

    const kept = await t.db('test_readings').where({ tenant_id: A.lab.id, id: res.body.testReading.id }).first();
    expect(kept).toMatchObject({ channel_id: A.ids.channelId, value: 21.37, sent_by: techId, outside_range: 0 });
    expect(Number(kept.ts)).toBe(clock);
    expect(await countRows('readings', { tenant_id: A.lab.id, channel_id: A.ids.channelId, ts: clock })).toBe(0);
    expect(await countRows('reading_rollups', { tenant_id: A.lab.id, channel_id: A.ids.channelId })).toBe(rollupsBefore);
    expect(await countRows('quarantined_rows', { tenant_id: A.lab.id })).toBe(quarantinedBefore);
    // a hand-sent value is not the logger speaking: it does not count as seen
    const logger = await t.db('loggers').where({ tenant_id: A.lab.id, id: A.ids.loggerId }).first();
    expect(logger.last_seen_at).toBeNull();
    const audit = await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'logger.test-reading', target_id: String(A.ids.loggerId) });
    expect(audit.map((e: { summary: string }) => e.summary)).toContain('Tove Technician sent a test reading of "air_t" to "' + logger.name + '"');
  });

  it('leaves the series and diagnostics of the channel exactly as they were, and a bounds alert rule does not fire for it', async () => {
    const f = await buildLabWithEverything(t.db, { name: 'Test Reading Lab Series' });
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    await t.db('alert_rules').where({ tenant_id: f.lab.id }).delete();
    clock += 3_600_000;
    const start = clock - 120 * 60_000;
    // 120 regular readings a minute apart, a slow wave around 20 (invented behaviour-check data)
    const readings = Array.from({ length: 120 }, (_, i) => ({ channel: 'air_t', ts: start + i * 60_000, value: 20 + Math.sin(i / 7) }));
    await request(app).post('/api/v1/ingest').set('Authorization', `Bearer ${f.ingestKey}`).send({ readings }).expect(200);
    const rule = await request(app)
      .post(`${base(f)}/alert-rules`)
      .set('Cookie', cookie)
      .send({ name: 'Air above 30', kind: 'bounds', channelId: f.ids.channelId, params: { high: 30, holdS: 0 } })
      .expect(201);

    const range = `from=${start}&to=${clock + 60_000}`;
    const series = () =>
      request(app)
        .get(`${base(f)}/channels/${f.ids.channelId}/series?${range}&points=1000`)
        .set('Cookie', cookie)
        .expect(200);
    const diagnostics = () =>
      request(app)
        .get(`${base(f)}/channels/${f.ids.channelId}/diagnostics?${range}&step=60&decomposition=none&maxLag=10`)
        .set('Cookie', cookie)
        .expect(200);
    const seriesBefore = (await series()).body;
    const diagBefore = (await diagnostics()).body;
    const rollupsBefore = await t.db('reading_rollups').where({ tenant_id: f.lab.id }).orderByRaw('1, 2, 3, 4');
    expect(seriesBefore.series.value.filter((v: number | null) => v !== null)).toHaveLength(120);
    expect(diagBefore.series.readings).toBe(120);

    // 45 is far above the rule's limit; the channel has no valid range, so no confirmation is asked
    const sent = await request(app).post(route(f)).set('Cookie', cookie).send({ channel: 'air_t', value: 45 }).expect(200);
    expect(sent.body.testReading.ts).toBe(clock);

    expect((await series()).body).toEqual(seriesBefore);
    const diagAfter = (await diagnostics()).body;
    expect(diagAfter.series).toEqual(diagBefore.series);
    expect(diagAfter.acf).toEqual(diagBefore.acf);
    expect(await t.db('reading_rollups').where({ tenant_id: f.lab.id }).orderByRaw('1, 2, 3, 4')).toEqual(rollupsBefore);

    const mailer = createMailer(t.config.smtp);
    try {
      const evaluator = createAlertEvaluator({
        db: t.db,
        mailer,
        logger: createLogWriter({ silent: true }),
        publicUrl: t.config.publicUrl,
        reminderAfterMin: 0,
      });
      await evaluator.evaluateChannels(f.lab.id, [f.ids.channelId], clock + 1000);
      expect(await t.db('alerts').where({ tenant_id: f.lab.id, rule_id: rule.body.rule.id })).toHaveLength(0);
      // the same value as a logger's reading does open the alert: the check above could fail
      await request(app)
        .post('/api/v1/ingest')
        .set('Authorization', `Bearer ${f.ingestKey}`)
        .send({ readings: [{ channel: 'air_t', ts: clock + 1000, value: 45 }] })
        .expect(200);
      await evaluator.evaluateChannels(f.lab.id, [f.ids.channelId], clock + 2000);
      const opened = await t.db('alerts').where({ tenant_id: f.lab.id, rule_id: rule.body.rule.id });
      expect(opened.map((a: { opened_value: number }) => a.opened_value)).toEqual([45]);
    } finally {
      mailer.close();
    }
  });

  it('asks for confirmation (409) for a value outside the valid range, then keeps it as a test reading flagged out of range', async () => {
    const channelId = await rangedChannel('fridge_t', 'Fridge temperature', -40, 60);
    const refused = await send(tech, { channel: 'fridge_t', value: -99999 }).expect(409);
    expect(refused.body.error).toMatchObject({
      code: 'outside_valid_range',
      fields: [{ field: 'value' }],
      message: 'Value: -99999 °C is outside the valid range -40…60 °C; send again with confirmation to store it as a test reading.',
    });
    expect(await countRows('test_readings', { tenant_id: A.lab.id, channel_id: channelId })).toBe(0);

    clock += 1000;
    const kept = await send(tech, { channel: 'fridge_t', value: -99999, confirmOutsideRange: true }).expect(200);
    expect(kept.body.testReading).toMatchObject({ channelId, value: -99999, outsideRange: true, source: 'test' });
    expect(await countRows('readings', { tenant_id: A.lab.id, channel_id: channelId })).toBe(0);
    // the bounds themselves are valid values: no question asked
    clock += 1000;
    await send(tech, { channel: 'fridge_t', value: 60 }).expect(200);
  });

  it('answers the quarantine reason a logger’s reading would get (unknown, retired channel) and keeps nothing anywhere', async () => {
    const founder = await sessionCookieFor(t.db, t.config.sessionSecret, A.founder.id);
    const old = await rangedChannel('old_t', 'Old probe', 0, 50);
    await request(app)
      .post(`${base(A)}/loggers/${A.ids.loggerId}/channels/${old}/retire`)
      .set('Cookie', founder)
      .expect(204);
    const tests = await countRows('test_readings', { tenant_id: A.lab.id });
    const quarantined = await countRows('quarantined_rows', { tenant_id: A.lab.id });

    const unknown = await send(tech, { channel: 'soil_q', value: 3 }).expect(200);
    expect(unknown.body.wouldGet).toEqual({ outcome: 'quarantined', code: 'unknown_channel', reason: 'channel: no channel "soil_q" on this logger' });
    expect(unknown.body.testReading).toBeNull();
    const retired = await send(tech, { channel: 'old_t', value: 3 }).expect(200);
    expect(retired.body.wouldGet).toEqual({ outcome: 'quarantined', code: 'retired_channel', reason: 'channel: "old_t" is retired' });

    expect(await countRows('test_readings', { tenant_id: A.lab.id })).toBe(tests);
    expect(await countRows('quarantined_rows', { tenant_id: A.lab.id })).toBe(quarantined);
    const audit = await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'logger.test-reading' }).where('summary', 'like', '%soil_q%');
    expect(audit).toHaveLength(1);
  });

  it('refuses non-finite, absurd or malformed input with field: reason, keeping nothing', async () => {
    const before = await countRows('test_readings', { tenant_id: A.lab.id });
    const cases: [object | string, string][] = [
      [{ channel: 'air_t', value: 'warm' }, 'Value: must be a number.'],
      [{ channel: 'air_t', value: 1e13 }, 'Value: must lie between -1,000,000,000,000 and 1,000,000,000,000 (a test reading is a plausible measurement).'],
      [{ channel: 'air_t', value: -1e300 }, 'Value: must lie between -1,000,000,000,000 and 1,000,000,000,000 (a test reading is a plausible measurement).'],
      [{ channel: 'air_t', value: 1, confirmOutsideRange: 'yes' }, 'Store it although it is outside the valid range: must be true or false.'],
      [{ channel: '', value: 1 }, 'Channel: use 1 to 64 letters, digits, "_", "." or "-", starting with a letter or digit.'],
    ];
    for (const [body, message] of cases) {
      const res = await send(tech, body as object).expect(400);
      expect(res.body.error).toEqual(expect.objectContaining({ code: 'invalid_input', message }));
    }
    // JSON has no Infinity or NaN: a body spelling them is not JSON and is refused as such
    const nan = await request(app).post(route(A)).set('Cookie', tech).set('Content-Type', 'application/json').send('{"channel":"air_t","value":NaN}');
    expect(nan.status).toBe(400);
    expect(await countRows('test_readings', { tenant_id: A.lab.id })).toBe(before);
  });

  it('refuses a guest and a scientist (403), answers 404 for another lab’s logger and a logger that does not exist', async () => {
    for (const cookie of [guest, scientist]) {
      const refused = await send(cookie, { channel: 'air_t', value: 1 }).expect(403);
      expect(refused.body.error.code).toBe('forbidden');
    }
    const foreign = await request(app).post(route(A, B.ids.loggerId)).set('Cookie', tech).send({ channel: 'air_t', value: 1 }).expect(404);
    expect(foreign.body.error.code).toBe('not_found');
    await request(app).post(route(A, 999_999_999_999)).set('Cookie', tech).send({ channel: 'air_t', value: 1 }).expect(404);
    expect(await countRows('test_readings', { tenant_id: B.lab.id, logger_id: B.ids.loggerId })).toBe(1); // only the fixture's own
  });
});

describe('removing a test reading', () => {
  async function sentNow(cookie = tech): Promise<number> {
    clock += 1000;
    return (await send(cookie, { channel: 'air_t', value: 5.5 }).expect(200)).body.testReading.id;
  }

  it('its sender removes it within 10 minutes (audit-logged); after 10 minutes of the service clock it stays (409)', async () => {
    const id = await sentNow();
    clock += 9 * 60_000 + 59_000;
    await request(app).delete(removal(A, id)).set('Cookie', tech).expect(204);
    expect(await countRows('test_readings', { tenant_id: A.lab.id, id })).toBe(0);
    const audit = await t.db('audit_events').where({ tenant_id: A.lab.id, action: 'logger.test-reading-removed' });
    expect(audit.map((e: { details: string | object }) => (typeof e.details === 'string' ? JSON.parse(e.details) : e.details).testReadingId)).toContain(id);

    const late = await sentNow();
    clock += 10 * 60_000;
    const res = await request(app).delete(removal(A, late)).set('Cookie', tech).expect(409);
    expect(res.body.error.code).toBe('removal_window_closed');
    expect(res.body.error.message).toMatch(/^A test reading can be removed only within 10 minutes of sending; this one was sent 10 minutes ago/);
    expect(await countRows('test_readings', { tenant_id: A.lab.id, id: late })).toBe(1);
  });

  it('another member may not remove it (403 naming the sender), nor may a scientist; another lab gets 404', async () => {
    const id = await sentNow();
    const other = await request(app).delete(removal(A, id)).set('Cookie', otherTech).expect(403);
    expect(other.body.error.message).toBe('Only the person who sent a test reading may remove it (this one was sent by Tove Technician).');
    await request(app).delete(removal(A, id)).set('Cookie', scientist).expect(403);
    await request(app)
      .delete(removal(A, id, B.ids.loggerId))
      .set('Cookie', tech)
      .expect(404);
    await request(app).delete(removal(A, 999_999_999)).set('Cookie', tech).expect(404);
    expect(await countRows('test_readings', { tenant_id: A.lab.id, id })).toBe(1);
  });
});

describe('reading test readings back', () => {
  it('lists a logger’s latest test readings newest first, with the asking member’s removal time', async () => {
    clock += 1000;
    const id = (await send(tech, { channel: 'air_t', value: 7.25 }).expect(200)).body.testReading.id;
    clock += 60_000;
    const mine = await request(app)
      .get(`${base(A)}/loggers/${A.ids.loggerId}/test-readings`)
      .set('Cookie', tech)
      .expect(200);
    expect(mine.body.timezone).toBe('UTC');
    expect(mine.body.testReadings.length).toBeLessThanOrEqual(10);
    expect(mine.body.testReadings[0]).toMatchObject({ id, value: 7.25, source: 'test', removableByYouForMs: 540_000 });
    const sentAts = mine.body.testReadings.map((r: { sentAt: string }) => r.sentAt);
    expect([...sentAts].sort().reverse()).toEqual(sentAts);
    const theirs = await request(app)
      .get(`${base(A)}/loggers/${A.ids.loggerId}/test-readings`)
      .set('Cookie', guest)
      .expect(200);
    expect(theirs.body.testReadings[0]).toMatchObject({ id, removableByYouForMs: 0 });
  });

  it('lists a channel’s test readings in a time range for its chart; another lab’s channel answers 404', async () => {
    const at = clock;
    await send(tech, { channel: 'air_t', value: 8.5 }).expect(200);
    const url = `${base(A)}/channels/${A.ids.channelId}/test-readings`;
    const inside = await request(app)
      .get(`${url}?from=${at}&to=${at + 1}`)
      .set('Cookie', guest)
      .expect(200);
    expect(inside.body).toMatchObject({ channelId: A.ids.channelId, from: at, to: at + 1 });
    expect(inside.body.testReadings.map((r: { value: number; ts: number }) => [r.ts, r.value])).toEqual([[at, 8.5]]);
    const before = await request(app)
      .get(`${url}?from=${at - 1}&to=${at}`)
      .set('Cookie', guest)
      .expect(200);
    expect(before.body.testReadings.every((r: { ts: number }) => r.ts < at)).toBe(true);
    const bad = await request(app)
      .get(`${url}?from=${at}&to=${at - 5}`)
      .set('Cookie', guest)
      .expect(400);
    expect(bad.body.error.message).toBe('To: must be after the start of the range.');
    const foreign = await request(app)
      .get(`${base(A)}/channels/${B.ids.channelId}/test-readings`)
      .set('Cookie', tech)
      .expect(404);
    expect(foreign.text).not.toContain('Test Reading Lab B');
  });

  it('refuses a retired logger (409) rather than keeping anything for it', async () => {
    await request(app)
      .post(`${base(A)}/loggers/${A.ids.loggerId}/retire`)
      .set('Cookie', tech)
      .expect(204);
    const res = await send(tech, { channel: 'air_t', value: 1 }).expect(409);
    expect(res.body.error.code).toBe('logger_retired');
  });
});
