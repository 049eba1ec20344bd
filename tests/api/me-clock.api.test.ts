import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything } from '../support/lab-fixture.ts';
import { onLargestPlan } from '../support/largest-plan.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer, type Mailer } from '../../server/integrations/mail/create-mailer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';
import { fetchCapturedMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';

/**
 * The person's clock choice (issue #19 item 1): `GET/PATCH /api/v1/me` carry `clock`
 * (`logger` by default, `mine`, `utc`), saved on its own or with the time zone; bad values get a
 * plain 400; alert mails give their times on the clock each reader chose, the zone named.
 */
let t: TestApp;
let mailer: Mailer;
const captureUrl = process.env.LAGBOOK_MAIL_CAPTURE_URL!;

beforeAll(async () => {
  t = await buildTestApp();
  mailer = createMailer(t.config.smtp);
});
afterAll(async () => {
  mailer.close();
  await t.close();
});

describe('the clock setting', () => {
  it('starts on the logger clock, changes alone or with the time zone, and refuses what it cannot use', async () => {
    const f = await buildLabWithEverything(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    const me = () => request(t.app).patch('/api/v1/me').set('Cookie', cookie);

    const first = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(first.body.user).toMatchObject({ clock: 'logger', timeZone: null });

    const both = await me().send({ timeZone: 'Europe/Berlin', clock: 'mine' }).expect(200);
    expect(both.body.user).toMatchObject({ clock: 'mine', timeZone: 'Europe/Berlin' });
    // the clock alone leaves the zone as it was
    const utc = await me().send({ clock: 'utc' }).expect(200);
    expect(utc.body.user).toMatchObject({ clock: 'utc', timeZone: 'Europe/Berlin' });
    // and the zone alone leaves the clock
    await me().send({ timeZone: null }).expect(200);
    const again = await request(t.app).get('/api/v1/me').set('Cookie', cookie).expect(200);
    expect(again.body.user).toMatchObject({ clock: 'utc', timeZone: null });
    expect(await t.db('users').where({ id: f.founder.id }).first('clock', 'time_zone')).toEqual({ clock: 'utc', time_zone: null });

    for (const body of [{ clock: 'local' }, { clock: 3 }, {}, { clock: 'utc', colour: 'green' }]) {
      const res = await me().send(body).expect(400);
      expect(res.body.error.message, JSON.stringify(body)).not.toMatch(/[a-z][A-Z]/);
    }
    const bad = await me().send({ clock: 'local' }).expect(400);
    expect(bad.body.error.message).toContain('Show times on');
    // nothing was changed by the refused requests
    expect(await t.db('users').where({ id: f.founder.id }).first('clock')).toEqual({ clock: 'utc' });
  });
});

describe('alert mails follow the reader’s clock', () => {
  it('logger → the logger’s zone, mine → the reader’s zone, utc → UTC, each named', async () => {
    const f = await buildLabWithEverything(t.db);
    await t.db('alerts').where({ tenant_id: f.lab.id }).delete();
    await t.db('alert_subscriptions').where({ tenant_id: f.lab.id }).delete();
    await t.db('alert_rules').where({ tenant_id: f.lab.id }).delete();
    await t.db('loggers').where({ tenant_id: f.lab.id, id: f.ids.loggerId }).update({ timezone: 'Europe/Berlin' });
    const stamp = Date.now().toString(36);
    const readers = {
      logger: await buildMember(t.db, f.lab, { role: 'technician', email: `clock-logger-${stamp}@cryo.example` }),
      mine: await buildMember(t.db, f.lab, { role: 'technician', email: `clock-mine-${stamp}@cryo.example` }),
      utc: await buildMember(t.db, f.lab, { role: 'technician', email: `clock-utc-${stamp}@cryo.example` }),
    };
    const cookies = Object.fromEntries(
      await Promise.all(Object.entries(readers).map(async ([k, u]) => [k, await sessionCookieFor(t.db, t.config.sessionSecret, u.id)] as const)),
    );
    const rule = await request(t.app)
      .post(`/api/v1/labs/${f.lab.slug}/alert-rules`)
      .set('Cookie', cookies.logger)
      .send({ name: 'Cold room warm', kind: 'bounds', channelId: f.ids.channelId, params: { high: 8 } })
      .expect(201);
    for (const [choice, cookie] of Object.entries(cookies)) {
      await request(t.app).put(`/api/v1/labs/${f.lab.slug}/alert-rules/${rule.body.rule.id}/subscription`).set('Cookie', cookie).expect(204);
      await request(t.app).patch('/api/v1/me').set('Cookie', cookie).send({ timeZone: 'Asia/Tokyo', clock: choice }).expect(200);
    }
    // One warm reading at 2026-12-02 10:09:00 UTC opens the alert.
    const at = Date.parse('2026-12-02T10:09:00Z');
    await ingestBatch(t.db, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, [{ index: 0, channel: 'air_t', ts: at, value: 12 }], { source: 'api' });
    const run = await createAlertEvaluator({
      db: t.db,
      mailer,
      logger: createLogWriter({ silent: true }),
      publicUrl: t.config.publicUrl,
      reminderAfterMin: 60,
    }).runOnce(at + 60_000);
    expect(run.ran).toBe(true);

    const mailOf = async (email: string) => {
      const opened = (await fetchCapturedMail(captureUrl, { to: email })).filter((m) => m.subject.includes('Alert:'));
      expect(opened).toHaveLength(1);
      return opened[0].text;
    };
    // Wall clocks from tzdata: Europe/Berlin is UTC+1 and Asia/Tokyo UTC+9 in December.
    expect(await mailOf(readers.logger.email)).toContain('at 2026-12-02 11:09:00 Europe/Berlin (10:09 UTC).');
    expect(await mailOf(readers.mine.email)).toContain('at 2026-12-02 19:09:00 Asia/Tokyo (10:09 UTC).');
    const utcMail = await mailOf(readers.utc.email);
    expect(utcMail).toContain('at 2026-12-02 10:09:00 UTC.');
    expect(utcMail).not.toContain('Europe/Berlin');
  });
});

describe('the readings export carries the logger’s clock', () => {
  it('adds a last column named after the logger’s zone, right across the spring change', async () => {
    const f = await buildLabWithEverything(t.db);
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    await onLargestPlan(t.db, f.lab.id); // March lies beyond the free plan's history
    await t.db('loggers').where({ tenant_id: f.lab.id, id: f.ids.loggerId }).update({ timezone: 'Europe/Berlin' });
    // EU summer time starts 2026-03-29 01:00 UTC (Directive 2000/84/EC): 01:59:59 CET, then 03:00 CEST.
    const before = Date.parse('2026-03-29T00:59:59Z');
    const after = Date.parse('2026-03-29T01:00:00Z');
    await ingestBatch(
      t.db,
      { tenantId: f.lab.id, loggerId: f.ids.loggerId },
      [
        { index: 0, channel: 'air_t', ts: before, value: 4.5 },
        { index: 1, channel: 'air_t', ts: after, value: 4.25 },
      ],
      { source: 'api' },
    );
    const res = await request(t.app)
      .get(`/api/v1/labs/${f.lab.slug}/channels/${f.ids.channelId}/readings.csv?from=${before}&to=${after + 1}`)
      .set('Cookie', cookie)
      .expect(200);
    expect(res.text.split('\r\n')).toEqual([
      'time_utc,epoch_ms,value,time_local_Europe/Berlin',
      `2026-03-29T00:59:59.000Z,${before},4.5,2026-03-29T01:59:59.000+01:00`,
      `2026-03-29T01:00:00.000Z,${after},4.25,2026-03-29T03:00:00.000+02:00`,
      '',
    ]);
  });
});
