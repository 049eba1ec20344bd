import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';

let t: TestApp;
let f: LabWithEverything;
let other: LabWithEverything;
let tech: string;
let sci: string;
let sciId: number;
let guest: string;

beforeAll(async () => {
  t = await buildTestApp();
  f = await buildLabWithEverything(t.db);
  other = await buildLabWithEverything(t.db);
  tech = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role: 'technician' })).id);
  const s = await buildMember(t.db, f.lab, { role: 'scientist' });
  sciId = s.id;
  sci = await sessionCookieFor(t.db, t.config.sessionSecret, s.id);
  guest = await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id);
});
afterAll(async () => t.close());

const base = () => `/api/v1/labs/${f.lab.slug}`;
const post = (body: object, cookie = tech) => request(t.app).post(`${base()}/alert-rules`).set('Cookie', cookie).send(body);

describe('alert rules: validation', () => {
  // message for people (labels of the rule form), fields by key for programs
  const cases: Array<{ name: string; body: () => object; message: string; fields: string[] }> = [
    {
      name: 'a negative hold time',
      body: () => ({ name: 'Warm', kind: 'bounds', channelId: f.ids.channelId, params: { high: 8, holdS: -5 } }),
      message: 'Outside the limits for at least (seconds): must not be negative (seconds).',
      fields: ['params.holdS'],
    },
    {
      name: 'low above high',
      body: () => ({ name: 'Band', kind: 'bounds', channelId: f.ids.channelId, params: { low: 9, high: 2 } }),
      message: 'Low limit: must be below the high limit.',
      fields: ['params.low'],
    },
    {
      name: 'no limit at all',
      body: () => ({ name: 'Band', kind: 'bounds', channelId: f.ids.channelId, params: {} }),
      message: 'High limit: set a low limit, a high limit or both.',
      fields: ['params.high'],
    },
    {
      name: 'a negative reminder delay',
      body: () => ({ name: 'Band', kind: 'bounds', channelId: f.ids.channelId, reminderAfterMin: -1, params: { high: 3 } }),
      message: 'Remind after (minutes): must not be negative (minutes).',
      fields: ['reminderAfterMin'],
    },
    {
      name: 'an unknown kind',
      body: () => ({ name: 'X', kind: 'sometimes', channelId: f.ids.channelId, params: {} }),
      message: 'Kind of rule: must be silence, bounds, rate or unusual.',
      fields: ['kind'],
    },
    {
      name: 'a rate limit of zero',
      body: () => ({ name: 'Jump', kind: 'rate', channelId: f.ids.channelId, params: { maxPerMinute: 0 } }),
      message: 'Largest change per minute: must be above 0.',
      fields: ['params.maxPerMinute'],
    },
    {
      name: 'silence with both a channel and a logger',
      body: () => ({ name: 'Quiet', kind: 'silence', channelId: f.ids.channelId, loggerId: f.ids.loggerId, params: { factor: 3 } }),
      message: 'Channel: choose either a channel or a whole logger to watch, not both.',
      fields: ['channelId'],
    },
    {
      name: 'an empty name and a silence factor below 1',
      body: () => ({ name: ' ', kind: 'silence', loggerId: f.ids.loggerId, params: { factor: 0.5 } }),
      message: 'Rule name: must not be empty. Silent for (expected intervals): must be at least 1 (one expected interval).',
      fields: ['name', 'params.factor'],
    },
  ];
  for (const c of cases) {
    it(`${c.name} → 400 "${c.message}"`, async () => {
      const res = await post(c.body()).expect(400);
      expect(res.body.error).toMatchObject({ code: 'invalid_input', message: c.message });
      expect(res.body.error.fields.map((p: { field: string }) => p.field)).toEqual(c.fields);
    });
  }

  it('an unusual-reading rule whose cycle is shorter than two readings → 422', async () => {
    // the fixture logger reports every 60 s; 0.01 h = 36 s
    const res = await post({ name: 'Odd', kind: 'unusual', channelId: f.ids.channelId, params: { periodH: 0.01 } }).expect(422);
    expect(res.body.error.message).toBe('Length of one cycle (hours): must span at least two expected intervals of the channel (60 seconds each).');
    expect(res.body.error.fields).toEqual([expect.objectContaining({ field: 'params.periodH' })]);
  });

  it("another lab's channel → 404 no such channel in this lab; another lab's logger → 404", async () => {
    const res = await post({ name: 'Theirs', kind: 'bounds', channelId: other.ids.channelId, params: { high: 1 } }).expect(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'No such channel in this lab.' });
    const res2 = await post({ name: 'Theirs', kind: 'silence', loggerId: other.ids.loggerId, params: { factor: 3 } }).expect(404);
    expect(res2.body.error.message).toBe('No such logger in this lab.');
  });

  it('PATCH checks new parameters against the rule kind (400) and refuses unknown fields', async () => {
    const made = await post({ name: 'Fridge warm', kind: 'bounds', channelId: f.ids.channelId, params: { high: 8, holdS: 120 } }).expect(201);
    const id = made.body.rule.id;
    const bad = await request(t.app)
      .patch(`${base()}/alert-rules/${id}`)
      .set('Cookie', tech)
      .send({ params: { low: 10, high: 8 } })
      .expect(400);
    expect(bad.body.error.message).toBe('Low limit: must be below the high limit.');
    const extra = await request(t.app).patch(`${base()}/alert-rules/${id}`).set('Cookie', tech).send({ kind: 'rate' }).expect(400);
    expect(extra.body.error.message).toBe('Kind of rule: is not a field of this form.');
  });
});

describe('alert rules: lifecycle', () => {
  it('makes a rule (maker subscribed, audited), lets a scientist subscribe, changes and deletes it', async () => {
    const made = await post({
      name: 'Cold room above 6 °C',
      kind: 'bounds',
      channelId: f.ids.channelId,
      params: { high: 6, holdS: 300 },
      reminderAfterMin: 30,
    }).expect(201);
    const rule = made.body.rule;
    expect(rule).toMatchObject({
      name: 'Cold room above 6 °C',
      kind: 'bounds',
      channelId: f.ids.channelId,
      params: { low: null, high: 6, holdS: 300 },
      reminderAfterMin: 30,
      enabled: true,
      subscribed: true,
      openAlertId: null,
    });
    expect(rule.watched).toMatchObject({ channelId: f.ids.channelId, label: 'Air temperature', unit: '°C' });

    let list = await request(t.app).get(`${base()}/alert-rules`).set('Cookie', sci).expect(200);
    expect(list.body.rules.find((r: { id: number }) => r.id === rule.id).subscribed).toBe(false);
    await request(t.app).put(`${base()}/alert-rules/${rule.id}/subscription`).set('Cookie', sci).expect(204);
    list = await request(t.app).get(`${base()}/alert-rules`).set('Cookie', sci).expect(200);
    expect(list.body.rules.find((r: { id: number }) => r.id === rule.id).subscribed).toBe(true);
    expect(await t.db('alert_subscriptions').where({ tenant_id: f.lab.id, rule_id: rule.id }).pluck('user_id')).toContain(sciId);
    await request(t.app).delete(`${base()}/alert-rules/${rule.id}/subscription`).set('Cookie', sci).expect(204);
    await request(t.app).put(`${base()}/alert-rules/${rule.id}/subscription`).set('Cookie', guest).expect(403);

    const changed = await request(t.app)
      .patch(`${base()}/alert-rules/${rule.id}`)
      .set('Cookie', tech)
      .send({ name: 'Cold room above 7 °C', params: { high: 7 } })
      .expect(200);
    expect(changed.body.rule).toMatchObject({ name: 'Cold room above 7 °C', params: { low: null, high: 7, holdS: 0 } });

    await request(t.app).delete(`${base()}/alert-rules/${rule.id}`).set('Cookie', tech).expect(204);
    await request(t.app).delete(`${base()}/alert-rules/${rule.id}`).set('Cookie', tech).expect(404);
    const actions = await t
      .db('audit_events')
      .where({ tenant_id: f.lab.id, target_id: String(rule.id) })
      .orderBy('at')
      .pluck('action');
    expect(actions).toEqual(['alert-rule.created', 'alert-rule.updated', 'alert-rule.deleted']);
  });

  it("acknowledges an alert with a note; another lab's alert is 404", async () => {
    const res = await request(t.app)
      .post(`${base()}/alerts/${f.ids.alertId}/acknowledge`)
      .set('Cookie', tech)
      .send({ note: 'Door left open; closed.' })
      .expect(200);
    expect(res.body.alert.acknowledged).toMatchObject({ note: 'Door left open; closed.' });
    await request(t.app).post(`${base()}/alerts/${other.ids.alertId}/acknowledge`).set('Cookie', tech).send({ note: 'x' }).expect(404);
  });

  it("lists recent alerts and a channel's alerts over a range", async () => {
    const all = await request(t.app).get(`${base()}/alerts`).set('Cookie', guest).expect(200);
    expect(all.body.alerts.map((a: { id: number }) => a.id)).toContain(f.ids.alertId);
    const open = await request(t.app).get(`${base()}/alerts?status=open`).set('Cookie', guest).expect(200);
    expect(open.body.alerts.map((a: { id: number }) => a.id)).not.toContain(f.ids.alertId);
    const now = Date.now();
    const band = await request(t.app)
      .get(`${base()}/channels/${f.ids.channelId}/alerts?from=${now - 7_200_000}&to=${now}`)
      .set('Cookie', guest)
      .expect(200);
    expect(band.body.alerts).toHaveLength(1);
    expect(band.body.alerts[0]).toMatchObject({ id: f.ids.alertId, open: false, openedValue: 31, resolvedValue: 29 });
    const before = await request(t.app)
      .get(`${base()}/channels/${f.ids.channelId}/alerts?from=${now - 9_000_000}&to=${now - 7_200_000}`)
      .set('Cookie', guest)
      .expect(200);
    expect(before.body.alerts).toEqual([]);
    await request(t.app).get(`${base()}/channels/${other.ids.channelId}/alerts`).set('Cookie', guest).expect(404);
  });
});
