import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, type TestUser } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer, type Mailer } from '../../server/integrations/mail/create-mailer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';
import { evaluateEarlyWarnings } from '../../server/services/alerts/early-warning/evaluate-early-warnings.ts';
import { coldRoomReadings } from '../../server/services/alerts/early-warning/cold-room-scenario.testkit.ts';
import { alertsRepo } from '../../server/db/alerts.repo.ts';
import { inLab } from '../../server/db/tenant-scope.ts';
import { fetchCapturedMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';

/**
 * Early warning on a bounds rule (issue #22 item 3) against the real database and the mail
 * capture: a cold room drifting warm towards its 8 °C limit (the fictional scenario of
 * cold-room-scenario.testkit.ts, three days of one-minute readings) opens an expected-stage alert
 * that names its model and interval; it is refreshed, not repeated; it hands over to the limit
 * alert when the limit is really passed, falls back on its own when the room cools, and a
 * channel with too little history is reported as not projected. The clock is simulated:
 * `evaluateEarlyWarnings` is called directly with `now`, and the evaluator's run (value rules,
 * then the outbox) sends the mail.
 */
let t: TestApp;
let mailer: Mailer;
const captureUrl = process.env.LAGBOOK_MAIL_CAPTURE_URL!;
const logger = createLogWriter({ silent: true });

beforeAll(async () => {
  t = await buildTestApp();
  mailer = createMailer(t.config.smtp);
});
afterAll(async () => {
  mailer.close();
  await t.close();
});

const evaluator = () => createAlertEvaluator({ db: t.db, mailer, logger, publicUrl: t.config.publicUrl, reminderAfterMin: 0 });
const DAY = 86_400_000;
/** Yesterday 12:30 UTC: the cold room is still warming towards its afternoon peak. */
const END = Math.floor(Date.now() / DAY) * DAY - DAY + 12.5 * 3_600_000;

let seq = 0;
async function setup(): Promise<{ f: LabWithEverything; watcher: TestUser; cookie: string }> {
  const f = await buildLabWithEverything(t.db);
  await t.db('alerts').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_subscriptions').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_rules').where({ tenant_id: f.lab.id }).delete();
  const watcher = await buildMember(t.db, f.lab, { role: 'technician', email: `early-${Date.now().toString(36)}-${seq++}@coldroom.example` });
  return { f, watcher, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, watcher.id) };
}

async function store(f: LabWithEverything, ts: number[], values: number[]) {
  const rows = values.map((value, i) => ({ index: i, channel: 'air_t', ts: ts[i], value }));
  await ingestBatch(t.db, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, rows, { source: 'api' });
}

async function makeRule(s: { f: LabWithEverything; cookie: string }, params: object): Promise<number> {
  const res = await request(t.app)
    .post(`/api/v1/labs/${s.f.lab.slug}/alert-rules`)
    .set('Cookie', s.cookie)
    .send({ name: 'Cold room 3 warm', kind: 'bounds', channelId: s.f.ids.channelId, params })
    .expect(201);
  await request(t.app).put(`/api/v1/labs/${s.f.lab.slug}/alert-rules/${res.body.rule.id}/subscription`).set('Cookie', s.cookie).expect(204);
  return res.body.rule.id;
}

const ctxOf = (f: LabWithEverything, now: number) => ({
  db: t.db,
  tenantId: f.lab.id,
  lab: { name: f.lab.name, slug: f.lab.slug },
  publicUrl: t.config.publicUrl,
  now,
});
const alertsOf = (f: LabWithEverything) => alertsRepo(inLab(t.db, f.lab.id)).list({ openOnly: false, since: 0, limit: 50 });
const subjects = async (who: TestUser) => (await fetchCapturedMail(captureUrl, { to: who.email })).map((m) => m.subject.replace(/^\[[^\]]*\] /, '')).sort();
const warming = { endAt: END, warmingMin: 180, rampMin: 60, warmingBy: 1.0 };

describe('early warning on a bounds rule', () => {
  it('a room drifting warm opens an expected-stage alert naming its model and interval; it is refreshed, not repeated; mail goes once', async () => {
    const s = await setup();
    const r = coldRoomReadings(warming);
    await store(s.f, r.ts, r.values);
    expect(Math.max(...r.values)).toBeLessThan(8); // the limit itself is not passed
    const ruleId = await makeRule(s, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.5 } });

    const first = await evaluateEarlyWarnings(ctxOf(s.f, END + 30_000));
    expect(first).toMatchObject({ opened: 1, resolved: 0, updated: 0, notProjected: [] });
    const [warning] = await alertsOf(s.f);
    expect(warning.stage).toBe('expected');
    expect(warning.ruleId).toBe(ruleId);
    expect(warning.openedAt).toBe(END);
    const p = warning.projection!;
    expect(p.model).toBe('ARIMA(0,1,0) on the remainder after the daily cycle');
    expect(p).toMatchObject({ limit: 8, side: 'high', horizonMin: 60, from: END, unit: '°C' });
    expect(p.chance).toBeGreaterThanOrEqual(0.5);
    expect(p.interval.level).toBe(0.8);
    expect(p.interval.lower).toBeLessThan(8);
    expect(p.interval.upper).toBeGreaterThan(8);
    expect(p.path).toHaveLength(60);
    expect(p.path[59]).toMatchObject({ at: END + 60 * 60_000, lower: p.interval.lower, upper: p.interval.upper });
    expect(warning.openedDetail).toMatch(
      /^Logger \d+ · Air temperature is likely \(p ≈ 0\.\d\d\) to rise above 8 °C within 60 minutes at its present course — ARIMA\(0,1,0\) on the remainder after the daily cycle; 80 % interval \d\.\d–\d\.\d °C at 60 minutes$/,
    );
    // the crossed-stage finder still means the limit alert: there is none
    expect(await alertsRepo(inLab(t.db, s.f.lab.id)).openForRule(ruleId)).toBeNull();
    expect((await alertsRepo(inLab(t.db, s.f.lab.id)).openWarningForRule(ruleId))!.id).toBe(warning.id);

    // the API lists it as open
    const listed = await request(t.app).get(`/api/v1/labs/${s.f.lab.slug}/alerts?status=open`).set('Cookie', s.cookie).expect(200);
    expect(listed.body.alerts.map((a: { id: number }) => a.id)).toEqual([warning.id]);

    await evaluator().runOnce(END + 40_000);
    expect(await subjects(s.watcher)).toEqual([`Early warning: Cold room 3 warm — Logger ${s.f.ids.loggerId} · Air temperature`]);

    // a minute later, one more warm reading: the warning is refreshed in place
    await store(s.f, [END + 60_000], [7.9]);
    const again = await evaluateEarlyWarnings(ctxOf(s.f, END + 90_000));
    expect(again).toMatchObject({ opened: 0, resolved: 0, updated: 1 });
    const rows = await alertsOf(s.f);
    expect(rows).toHaveLength(1);
    expect(rows[0].projection!.from).toBe(END + 60_000);
    await evaluator().runOnce(END + 100_000);
    expect(await subjects(s.watcher)).toHaveLength(1);
  });

  it('the limit really passed: the limit alert opens as always and the warning hands over to it', async () => {
    const s = await setup();
    const r = coldRoomReadings(warming);
    await store(s.f, r.ts, r.values);
    const ruleId = await makeRule(s, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.5 } });
    expect((await evaluateEarlyWarnings(ctxOf(s.f, END + 30_000))).opened).toBe(1);
    await store(s.f, [END + 60_000, END + 120_000], [8.1, 8.3]);
    // one evaluator run: the value rule opens the limit alert, then the early warning hands over to it
    const run = await evaluator().runOnce(END + 150_000);
    expect(run).toMatchObject({ opened: 1, resolved: 1 });
    expect(await evaluateEarlyWarnings(ctxOf(s.f, END + 160_000))).toMatchObject({ opened: 0, resolved: 0 });
    const rows = await alertsOf(s.f);
    const byStage = Object.fromEntries(rows.map((a) => [a.stage, a]));
    expect(byStage.crossed).toMatchObject({ ruleId, resolvedAt: null, openedValue: 8.1 });
    expect(byStage.crossed.openedDetail).toBe('8.1 °C is above the high limit 8 °C');
    expect(byStage.expected).toMatchObject({ resolvedAt: END + 150_000, resolvedDetail: 'the limit was passed: the limit alert takes over' });
    // no new warning opens beside the open limit alert
    expect((await evaluateEarlyWarnings(ctxOf(s.f, END + 170_000))).opened).toBe(0);
  });

  it('the room cools back: the warning resolves itself below the level less 0.1; switching the warning off resolves an open one', async () => {
    const s = await setup();
    const r = coldRoomReadings(warming);
    await store(s.f, r.ts, r.values);
    const ruleId = await makeRule(s, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.5 } });
    expect((await evaluateEarlyWarnings(ctxOf(s.f, END + 30_000))).opened).toBe(1);
    // the door is shut: an hour back at the usual 6.3–6.9 °C
    const cool = Array.from({ length: 60 }, (_, i) => Math.round((6.9 - 0.01 * i) * 100) / 100);
    await store(
      s.f,
      cool.map((_, i) => END + (i + 1) * 60_000),
      cool,
    );
    const back = await evaluateEarlyWarnings(ctxOf(s.f, END + 61 * 60_000));
    expect(back).toMatchObject({ opened: 0, resolved: 1 });
    const [resolved] = await alertsOf(s.f);
    expect(resolved.resolvedDetail).toMatch(/^the projection fell back \(p ≈ 0\.\d\d of passing 8 °C within 60 minutes\)$/);
    expect(Number(resolved.resolvedDetail!.match(/0\.\d\d/)![0])).toBeLessThan(0.4);

    // warm again, then the warning is switched off on the rule: the open warning resolves
    const s2 = await setup();
    await store(s2.f, r.ts, r.values);
    const rule2 = await makeRule(s2, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.5 } });
    expect((await evaluateEarlyWarnings(ctxOf(s2.f, END + 30_000))).opened).toBe(1);
    await request(t.app)
      .patch(`/api/v1/labs/${s2.f.lab.slug}/alert-rules/${rule2}`)
      .set('Cookie', s2.cookie)
      .send({ params: { high: 8, holdS: 0, earlyWarning: null } })
      .expect(200);
    expect(await evaluateEarlyWarnings(ctxOf(s2.f, END + 40_000))).toMatchObject({ resolved: 1 });
    expect((await alertsOf(s2.f))[0].resolvedDetail).toBe('the early warning was switched off on the rule');
    expect(ruleId).not.toBe(rule2);
  });

  it('a steady room raises no warning; a rule without the opt-in is left alone', async () => {
    const s = await setup();
    const r = coldRoomReadings({ endAt: END });
    await store(s.f, r.ts, r.values);
    await makeRule(s, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.5 } });
    await makeRule(s, { high: 7, holdS: 0 });
    const counts = await evaluateEarlyWarnings(ctxOf(s.f, END + 30_000));
    expect(counts).toEqual({ opened: 0, resolved: 0, updated: 0, notProjected: [] });
    expect(await alertsOf(s.f)).toHaveLength(0);
  });

  it('too little history or a silent channel is reported as not projected, with its reason', async () => {
    const s = await setup();
    const r = coldRoomReadings({ endAt: END, days: 1 });
    const last30 = { ts: r.ts.slice(-30), values: r.values.slice(-30) };
    await store(s.f, last30.ts, last30.values);
    const ruleId = await makeRule(s, { high: 8, holdS: 0, earlyWarning: { horizonMin: 60, chance: 0.8 } });
    expect(await evaluateEarlyWarnings(ctxOf(s.f, END + 30_000))).toEqual({
      opened: 0,
      resolved: 0,
      updated: 0,
      notProjected: [{ ruleId, reason: 'too-little-history', detail: 'only 30 of the last 30 steps hold readings; at least 60 are needed' }],
    });
    expect(await evaluateEarlyWarnings(ctxOf(s.f, END + 2 * 3_600_000))).toMatchObject({
      notProjected: [{ ruleId, reason: 'logger-silent', detail: 'the channel has had no reading for 2 hours' }],
    });
  });
});
