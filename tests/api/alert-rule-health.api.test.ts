import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, type TestUser } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer, type Mailer } from '../../server/integrations/mail/create-mailer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { createAlertEvaluator } from '../../server/services/alerts/alert-evaluator.ts';
import type { AlertRule } from '../../server/contract/alerts.ts';
import { fetchCapturedMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';

/**
 * Rule health against the real database and the local mail capture, on a simulated clock
 * (passed to runOnce): a rule that cannot watch its channel says so in the API with its reason
 * and since when, mails its subscribers once after its delay and once when it watches again.
 * Readings are stored through the ingestion path; values are a fictional glasshouse.
 */
let t: TestApp;
let mailer: Mailer;
const captureUrl = process.env.LAGBOOK_MAIL_CAPTURE_URL!;
const logger = createLogWriter({ silent: true });
const HOUR = 3_600_000;
const MIN = 60_000;

beforeAll(async () => {
  t = await buildTestApp();
  mailer = createMailer(t.config.smtp);
});
afterAll(async () => {
  mailer.close();
  await t.close();
});

const evaluator = () => createAlertEvaluator({ db: t.db, mailer, logger, publicUrl: t.config.publicUrl, reminderAfterMin: 0 });

let seq = 0;
async function setup(): Promise<{ f: LabWithEverything; watcher: TestUser; cookie: string }> {
  const f = await buildLabWithEverything(t.db);
  await t.db('alerts').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_subscriptions').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_rules').where({ tenant_id: f.lab.id }).delete();
  const watcher = await buildMember(t.db, f.lab, { role: 'technician', email: `health-${Date.now().toString(36)}-${seq++}@glasshouse.example` });
  return { f, watcher, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, watcher.id) };
}

async function makeRule(s: { f: LabWithEverything; cookie: string }, body: object): Promise<number> {
  const res = await request(t.app).post(`/api/v1/labs/${s.f.lab.slug}/alert-rules`).set('Cookie', s.cookie).send(body).expect(201);
  return res.body.rule.id;
}

async function ruleOf(s: { f: LabWithEverything; cookie: string }, id: number): Promise<AlertRule> {
  const res = await request(t.app).get(`/api/v1/labs/${s.f.lab.slug}/alert-rules`).set('Cookie', s.cookie).expect(200);
  return (res.body.rules as AlertRule[]).find((r) => r.id === id)!;
}

async function store(f: LabWithEverything, start: number, stepMs: number, values: number[]) {
  const rows = values.map((value, i) => ({ index: i, channel: 'air_t', ts: start + i * stepMs, value }));
  await ingestBatch(t.db, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, rows, { source: 'api' });
}

const subjects = async (who: TestUser) => (await fetchCapturedMail(captureUrl, { to: who.email })).map((m) => m.subject.replace(/^\[[^\]]*\] /, ''));

/** Fictional hourly glasshouse air temperature: 17 °C ± 4 °C daily cycle, seeded noise, two decimals as the logger sends. */
function glasshouse(seed: number) {
  let state = seed;
  const noise = () => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32 - 0.5) * 0.4;
  return (h: number) => Math.round((17 + 4 * Math.cos((2 * Math.PI * (h - 14)) / 24) + noise()) * 100) / 100;
}

describe('alert rule health', () => {
  it('too little history: not watching with its reason; mailed once after the delay (not before, not twice); watching again mailed once', async () => {
    const s = await setup();
    await t.db('channels').where({ tenant_id: s.f.lab.id, id: s.f.ids.channelId }).update({ expected_interval_s: 3600 });
    const air = glasshouse(5);
    const day0 = Math.floor(Date.now() / 86_400_000) * 86_400_000 - 5 * 86_400_000;
    await store(
      s.f,
      day0,
      HOUR,
      Array.from({ length: 24 }, (_, h) => air(h)),
    ); // one day before the rule
    const ruleId = await makeRule(s, { name: 'Air odd', kind: 'unusual', channelId: s.f.ids.channelId, params: { periodH: 24, k: 5, historyCycles: 3 } });
    expect((await ruleOf(s, ruleId)).health).toEqual({ lastJudgedAt: null, notWatching: null });
    // the simulated clock runs five days behind the real one: the rule counts as made on day 0
    await t.db('alert_rules').where({ tenant_id: s.f.lab.id, id: ruleId }).update({ watching_since: day0 });

    await store(s.f, day0 + 24 * HOUR, HOUR, [air(24)]);
    await evaluator().runOnce(day0 + 24 * HOUR + MIN);
    const blind = (await ruleOf(s, ruleId)).health;
    expect(blind).toEqual({
      lastJudgedAt: null,
      notWatching: {
        reason: 'too-little-history',
        detail: 'The history holds readings for only the last 24 of its 72 steps; at least 49 are needed to learn the usual pattern.',
        since: day0 + 24 * HOUR,
      },
    });
    // 59 minutes blind: the one-hour delay (no reminder delay on the rule or the lab) has not passed
    await evaluator().runOnce(day0 + 24 * HOUR + 59 * MIN);
    expect(await subjects(s.watcher)).toEqual([]);
    await store(s.f, day0 + 25 * HOUR, HOUR, [air(25)]);
    await evaluator().runOnce(day0 + 25 * HOUR + MIN);
    await evaluator().runOnce(day0 + 25 * HOUR + 30 * MIN);
    const notWatching = `Not watching: Air odd — Logger ${s.f.ids.loggerId} · Air temperature`;
    expect(await subjects(s.watcher)).toEqual([notWatching]);
    const mail = (await fetchCapturedMail(captureUrl, { to: s.watcher.email }))[0];
    expect(mail.text).toContain(
      `is not watching Logger ${s.f.ids.loggerId} · Air temperature since ${new Date(day0 + 24 * HOUR).toISOString().slice(0, 19).replace('T', ' ')} UTC: too little history to learn the usual pattern.`,
    );

    // the rest of three days arrives in one upload, judged against the history before its first reading: still too little, the same "since"
    await store(
      s.f,
      day0 + 26 * HOUR,
      HOUR,
      Array.from({ length: 47 }, (_, i) => air(26 + i)),
    );
    await evaluator().runOnce(day0 + 72 * HOUR + MIN);
    const still = (await ruleOf(s, ruleId)).health.notWatching!;
    expect([still.reason, still.since]).toEqual(['too-little-history', day0 + 24 * HOUR]);
    expect(await subjects(s.watcher)).toEqual([notWatching]);

    // the next reading has three full cycles behind it: judged, watching again, one mail
    await store(s.f, day0 + 73 * HOUR, HOUR, [air(73)]);
    await evaluator().runOnce(day0 + 73 * HOUR + MIN);
    expect((await ruleOf(s, ruleId)).health).toEqual({ lastJudgedAt: day0 + 73 * HOUR, notWatching: null });
    await evaluator().runOnce(day0 + 73 * HOUR + 20 * MIN);
    const watchingAgain = `Watching again: Air odd — Logger ${s.f.ids.loggerId} · Air temperature`;
    expect((await subjects(s.watcher)).sort()).toEqual([notWatching, watchingAgain]);
    expect(Number((await t.db('notification_outbox').where({ tenant_id: s.f.lab.id }).count({ n: '*' }))[0].n)).toBe(2);
  });

  it('a silent logger: not watching from the moment 3 expected intervals passed, mailed after the rule’s own delay, recovered when readings return', async () => {
    const s = await setup();
    const t0 = Date.now() - 6 * HOUR;
    await store(s.f, t0, MIN, [4.1, 4.2, 4.1]);
    const ruleId = await makeRule(s, { name: 'Cold room warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 8 }, reminderAfterMin: 10 });
    await t.db('alert_rules').where({ tenant_id: s.f.lab.id, id: ruleId }).update({ watching_since: t0 });
    await store(s.f, t0 + 3 * MIN, MIN, [4.3]);
    await evaluator().runOnce(t0 + 4 * MIN);
    expect((await ruleOf(s, ruleId)).health).toEqual({ lastJudgedAt: t0 + 3 * MIN, notWatching: null });
    // the fixture logger reports every 60 s: silent once more than 180 s pass after the reading at minute 3
    await evaluator().runOnce(t0 + 7 * MIN);
    const silent = (await ruleOf(s, ruleId)).health.notWatching!;
    expect([silent.reason, silent.since]).toEqual(['logger-silent', t0 + 6 * MIN]);
    expect(silent.detail).toBe('No reading for more than 3 expected intervals (the channel reports every 60 seconds).');
    await evaluator().runOnce(t0 + 15 * MIN);
    expect(await subjects(s.watcher)).toEqual([]);
    await evaluator().runOnce(t0 + 16 * MIN);
    await evaluator().runOnce(t0 + 17 * MIN);
    expect(await subjects(s.watcher)).toEqual([`Not watching: Cold room warm — Logger ${s.f.ids.loggerId} · Air temperature`]);
    await store(s.f, t0 + 20 * MIN, MIN, [4.4]);
    await evaluator().runOnce(t0 + 20 * MIN + 10_000);
    await evaluator().runOnce(t0 + 20 * MIN + 20_000);
    expect((await ruleOf(s, ruleId)).health).toEqual({ lastJudgedAt: t0 + 20 * MIN, notWatching: null });
    expect((await subjects(s.watcher)).filter((m) => m.startsWith('Watching again: Cold room warm'))).toHaveLength(1);
  });

  it('a channel that never reported: no-readings since the rule was made', async () => {
    const s = await setup();
    const ruleId = await makeRule(s, { name: 'Humidity high', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 90 } });
    const made = (await t.db('alert_rules').where({ tenant_id: s.f.lab.id, id: ruleId }).first()).watching_since;
    await evaluator().runOnce(Number(made) + MIN);
    expect((await ruleOf(s, ruleId)).health).toEqual({
      lastJudgedAt: null,
      notWatching: { reason: 'no-readings', detail: 'No reading has arrived on this channel yet.', since: Number(made) },
    });
  });

  it('a retired channel: not watching, the channel is retired', async () => {
    const s = await setup();
    await store(s.f, Date.now() - 2 * MIN, MIN, [5.5, 5.6]);
    const ruleId = await makeRule(s, { name: 'Cold room low', kind: 'bounds', channelId: s.f.ids.channelId, params: { low: 1 } });
    await request(t.app)
      .post(`/api/v1/labs/${s.f.lab.slug}/loggers/${s.f.ids.loggerId}/channels/${s.f.ids.channelId}/retire`)
      .set('Cookie', s.cookie)
      .expect(204);
    const run = Date.now() + 1000;
    await evaluator().runOnce(run);
    const health = (await ruleOf(s, ruleId)).health;
    expect(health.notWatching?.reason).toBe('channel-retired');
    expect(health.notWatching?.detail).toBe('The channel was retired; no more readings will come.');
    expect(health.notWatching!.since).toBeLessThanOrEqual(run);
  });

  it('a silence rule has no health of its own (its alert is the silence)', async () => {
    const s = await setup();
    const ruleId = await makeRule(s, { name: 'Logger quiet', kind: 'silence', loggerId: s.f.ids.loggerId, params: { factor: 3 } });
    await evaluator().runOnce(Date.now() + HOUR);
    expect((await ruleOf(s, ruleId)).health).toEqual({ lastJudgedAt: null, notWatching: null });
  });
});
