import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor, type TestUser } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { createMailer, type Mailer } from '../../server/integrations/mail/create-mailer.ts';
import { ingestBatch } from '../../server/services/ingest/ingest-batch.ts';
import { createAlertEvaluator, EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS } from '../../server/services/alerts/alert-evaluator.ts';
import { evaluateValueRule } from '../../server/services/alerts/rule-evaluation.ts';
import { createLeaseRunner, LeaseLostError } from '../../server/jobs/job-lease.ts';
import { jobLeasesRepo } from '../../server/db/job-leases.repo.ts';
import { fetchCapturedMail, waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';

/**
 * The alert evaluator against the real database and the local mail capture: rules fire and
 * resolve at the right readings, every notification goes out exactly once across restarts,
 * crashes, two racing evaluators and a mail server that is down; the evaluator's lease (one run
 * at a time across servers, each scheduled cycle once, fencing, takeover after a crash). The clock
 * is simulated (passed to runOnce, and to the lease where a test needs it to move); readings are
 * stored through the ingestion path.
 */
let t: TestApp;
let mailer: Mailer;
const extraDbs: Db[] = [];
const captureUrl = process.env.LAGBOOK_MAIL_CAPTURE_URL!;
const logger = createLogWriter({ silent: true });

beforeAll(async () => {
  t = await buildTestApp();
  mailer = createMailer(t.config.smtp);
});
afterAll(async () => {
  mailer.close();
  await Promise.all(extraDbs.map((d) => d.destroy()));
  await t.close();
});

const evaluator = (over: Partial<Parameters<typeof createAlertEvaluator>[0]> = {}) =>
  createAlertEvaluator({ db: t.db, mailer, logger, publicUrl: t.config.publicUrl, reminderAfterMin: 0, ...over });

let seq = 0;
/** A lab with a watcher (technician) subscribed to nothing yet, the fixture's alert material removed. */
async function setup(): Promise<{ f: LabWithEverything; watcher: TestUser; cookie: string }> {
  const f = await buildLabWithEverything(t.db);
  await t.db('alerts').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_subscriptions').where({ tenant_id: f.lab.id }).delete();
  await t.db('alert_rules').where({ tenant_id: f.lab.id }).delete();
  const watcher = await buildMember(t.db, f.lab, { role: 'technician', email: `watch-${Date.now().toString(36)}-${seq++}@cryo.example` });
  return { f, watcher, cookie: await sessionCookieFor(t.db, t.config.sessionSecret, watcher.id) };
}

async function makeRule(s: { f: LabWithEverything; cookie: string }, body: object): Promise<number> {
  const res = await request(t.app).post(`/api/v1/labs/${s.f.lab.slug}/alert-rules`).set('Cookie', s.cookie).send(body).expect(201);
  return res.body.rule.id;
}

/** Stores readings of the fixture channel (air_t) through the ingestion path, without the app's hooks. */
async function store(f: LabWithEverything, start: number, stepMs: number, values: number[], channel = 'air_t') {
  const rows = values.map((value, i) => ({ index: i, channel, ts: start + i * stepMs, value }));
  await ingestBatch(t.db, { tenantId: f.lab.id, loggerId: f.ids.loggerId }, rows, { source: 'api' });
}

const mailTo = async (who: TestUser) => (await fetchCapturedMail(captureUrl, { to: who.email })).map((m) => m.subject.replace(/^\[[^\]]*\] /, ''));
const alertsOf = (f: LabWithEverything) => t.db('alerts').where({ tenant_id: f.lab.id }).orderBy('opened_at');

/** A clock that only moves when told (the lease's clock; starts at the real time so no lease is left held for later tests). */
function simulatedClock(start = Date.now()) {
  let at = start;
  return { now: () => at, advance: (ms: number) => (at += ms) };
}

/** The job_runs rows of the evaluator's cycle starting at `periodStart`. */
const cycleRows = (periodStart: number) => t.db('job_runs').where({ name: EVALUATOR_LEASE, period_start: new Date(periodStart) });

/** Simulated hourly readings (behaviour test): 21 °C ± 3 °C daily cycle peaking at 15:00, seeded noise ±0.2 °C, two decimals as a logger sends them, from five days ago. */
function growthRoom(seed: number) {
  let state = seed;
  const noise = () => ((state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32 - 0.5) * 0.4;
  const day0 = Math.floor(Date.now() / 86_400_000) * 86_400_000 - 5 * 86_400_000;
  return { day0, usual: (h: number) => Math.round((21 + 3 * Math.cos((2 * Math.PI * (h - 15)) / 24) + noise()) * 100) / 100 };
}

describe('alert evaluation', () => {
  it('bounds with hold: a single warm reading pages nobody; a sustained one opens once and resolves; each subscriber is mailed once per event', async () => {
    const s = await setup();
    const colleague = await buildMember(t.db, s.f.lab, { role: 'scientist', email: `colleague-${Date.now().toString(36)}@cryo.example` });
    const ruleId = await makeRule(s, { name: 'Freezer too warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: -15, holdS: 300 } });
    const colleagueCookie = await sessionCookieFor(t.db, t.config.sessionSecret, colleague.id);
    await request(t.app).put(`/api/v1/labs/${s.f.lab.slug}/alert-rules/${ruleId}/subscription`).set('Cookie', colleagueCookie).expect(204);
    // the colleague reads times on their own clock (the logger is on UTC)
    await request(t.app).patch('/api/v1/me').set('Cookie', colleagueCookie).send({ timeZone: 'Asia/Tokyo', clock: 'mine' }).expect(200);
    const t0 = Date.now() - 3_600_000;
    // minute:  0    1    2   3    4 … 9 (warm for 6 min)          10   11
    const values = [-20, -20, -5, -20, -10, -10, -10, -10, -10, -10, -20, -19];
    await store(s.f, t0, 60_000, values);
    const run = await evaluator().runOnce(t0 + 12 * 60_000);
    expect(run.ran).toBe(true);
    const rows = await alertsOf(s.f);
    expect(rows).toHaveLength(1);
    // first warm reading of the sustained run at minute 4; hold 300 s → opens at minute 9; resolves at minute 10
    expect([Number(rows[0].opened_at), Number(rows[0].opened_value), Number(rows[0].resolved_at), Number(rows[0].resolved_value)]).toEqual([
      t0 + 9 * 60_000,
      -10,
      t0 + 10 * 60_000,
      -20,
    ]);
    for (const who of [s.watcher, colleague]) {
      expect((await mailTo(who)).sort()).toEqual([
        `Alert: Freezer too warm — Logger ${s.f.ids.loggerId} · Air temperature`,
        `Resolved: Freezer too warm — Logger ${s.f.ids.loggerId} · Air temperature`,
      ]);
    }
    const opened = (await fetchCapturedMail(captureUrl, { to: s.watcher.email })).find((m) => m.subject.includes('Alert:'))!;
    expect(opened.text).toContain(
      `${t.config.publicUrl}/labs/${s.f.lab.slug}/channels/${s.f.ids.channelId}?from=${t0 + 9 * 60_000 - 6 * 3_600_000}&to=${t0 + 9 * 60_000 + 3_600_000}`,
    );
    expect(opened.text).toContain('Reading: -10 °C at');
    // every number with the channel's unit, the hold time in words
    expect(opened.text).toContain('What was seen: -10 °C is above the high limit -15 °C for 5 minutes.');
    expect(opened.text).not.toContain('your time');
    const theirs = (await fetchCapturedMail(captureUrl, { to: colleague.email })).find((m) => m.subject.includes('Alert:'))!;
    expect(theirs.text).toMatch(/Reading: -10 °C at \d{4}-\d\d-\d\d \d\d:\d\d:\d\d Asia\/Tokyo \(\d\d:\d\d UTC\)\./);
    // running again (as after a restart) changes and sends nothing
    const again = await evaluator().runOnce(t0 + 13 * 60_000);
    expect(again.ran).toBe(true);
    expect(await alertsOf(s.f)).toHaveLength(1);
    expect(await mailTo(s.watcher)).toHaveLength(2);
  });

  it('a hold pending at the end of one run is remembered by the next (state in MariaDB)', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Incubator warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 38, holdS: 120 } });
    const t0 = Date.now() - 3_600_000;
    await store(s.f, t0, 60_000, [37, 39, 39]); // warm since minute 1, only 60 s so far
    await evaluator().runOnce(t0 + 3 * 60_000);
    expect(await alertsOf(s.f)).toHaveLength(0);
    await store(s.f, t0 + 3 * 60_000, 60_000, [39]); // minute 3: 120 s since minute 1
    await evaluator().runOnce(t0 + 4 * 60_000);
    const rows = await alertsOf(s.f);
    expect(rows.map((r) => Number(r.opened_at))).toEqual([t0 + 3 * 60_000]);
  });

  it('rate of change opens at the jump and resolves at the next calm reading', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Door opened', kind: 'rate', channelId: s.f.ids.channelId, params: { maxPerMinute: 1, direction: 'rise' } });
    const t0 = Date.now() - 3_600_000;
    // +0.2, +0.2, +3 (jump), +0.1, −4 (a fall, not watched)
    await store(s.f, t0, 60_000, [4, 4.2, 4.4, 7.4, 7.5, 3.5]);
    await evaluator().runOnce(t0 + 6 * 60_000);
    const rows = await alertsOf(s.f);
    expect(rows.map((r) => [Number(r.opened_at) - t0, Number(r.resolved_at) - t0])).toEqual([[3 * 60_000, 4 * 60_000]]);
  });

  it('silence on a logger opens after factor × interval without readings and resolves when readings return; reminders follow the delay and stop once acknowledged', async () => {
    const s = await setup();
    const t0 = Date.now() - 7_200_000;
    await store(s.f, t0, 60_000, [5]);
    await makeRule(s, { name: 'Logger quiet', kind: 'silence', loggerId: s.f.ids.loggerId, params: { factor: 3 }, reminderAfterMin: 10 });
    const quietSince = t0; // the fixture logger reports every 60 s: limit 180 s
    const ev = evaluator();
    const start = Date.now();
    await ev.runOnce(start);
    const [open] = await alertsOf(s.f);
    expect(Number(open.opened_at)).toBe(quietSince + 180_000);
    expect(await mailTo(s.watcher)).toEqual([`Alert: Logger quiet — every channel of Logger ${s.f.ids.loggerId}`]);
    await ev.runOnce(start + 9 * 60_000);
    expect(await mailTo(s.watcher)).toHaveLength(1);
    await ev.runOnce(start + 11 * 60_000);
    await ev.runOnce(start + 12 * 60_000);
    expect((await mailTo(s.watcher)).filter((m) => m.startsWith('Still open (reminder 1)'))).toHaveLength(1);
    await request(t.app)
      .post(`/api/v1/labs/${s.f.lab.slug}/alerts/${open.id}/acknowledge`)
      .set('Cookie', s.cookie)
      .send({ note: 'Battery swap under way' })
      .expect(200);
    await ev.runOnce(start + 40 * 60_000);
    expect(await mailTo(s.watcher)).toHaveLength(2);
    await store(s.f, start + 41 * 60_000, 60_000, [5.5]);
    await ev.runOnce(start + 41.5 * 60_000);
    const [closed] = await alertsOf(s.f);
    expect(Number(closed.resolved_at)).toBe(start + 41 * 60_000);
    expect((await mailTo(s.watcher)).filter((m) => m.startsWith('Resolved: Logger quiet'))).toHaveLength(1);
  });

  it('unusual reading: the usual afternoon peak passes, a 3 a.m. spike of the same height opens an alert', async () => {
    const s = await setup();
    await t.db('channels').where({ tenant_id: s.f.lab.id, id: s.f.ids.channelId }).update({ expected_interval_s: 3600 });
    const { day0, usual } = growthRoom(11);
    await makeRule(s, { name: 'Growth room odd', kind: 'unusual', channelId: s.f.ids.channelId, params: { periodH: 24, k: 5, historyCycles: 3 } });
    await store(
      s.f,
      day0,
      3_600_000,
      Array.from({ length: 72 }, (_, h) => usual(h)),
    );
    await evaluator().runOnce(day0 + 72 * 3_600_000);
    await store(
      s.f,
      day0 + 72 * 3_600_000,
      3_600_000,
      Array.from({ length: 24 }, (_, h) => usual(72 + h)),
    ); // day 4, peak ≈ 24 °C at 15:00
    await evaluator().runOnce(day0 + 96 * 3_600_000);
    expect(await alertsOf(s.f)).toHaveLength(0);
    await store(s.f, day0 + 96 * 3_600_000, 3_600_000, [usual(96), usual(97), usual(98), 24, usual(100)]); // 24 °C at 03:00
    await evaluator().runOnce(day0 + 101 * 3_600_000);
    const rows = await alertsOf(s.f);
    expect(rows.map((r) => [Number(r.opened_at), Number(r.opened_value), Number(r.resolved_at)])).toEqual([
      [day0 + 99 * 3_600_000, 24, day0 + 100 * 3_600_000],
    ]);
    // the readings carry two decimals: the reading and the usual value at that resolution, the distance as a rough multiple, with units
    expect(rows[0].opened_detail).toMatch(
      /^24\.00 °C, about \d+(\.\d)? times the usual spread above the usual 1\d\.\d\d °C for this time of day \(limit 5 times the spread\)$/,
    );
    expect(rows[0].resolved_detail).toMatch(/^\d+\.\d\d °C fits the usual pattern again \(the usual \d+\.\d\d °C for this time of day\)$/);
  });

  it('unusual reading: a spike right after a logger outage opens an alert (the empty hours before it do not stop the judgement)', async () => {
    const s = await setup();
    await t.db('channels').where({ tenant_id: s.f.lab.id, id: s.f.ids.channelId }).update({ expected_interval_s: 3600 });
    const { day0, usual } = growthRoom(23);
    await makeRule(s, { name: 'Growth room odd', kind: 'unusual', channelId: s.f.ids.channelId, params: { periodH: 24, k: 5, historyCycles: 3 } });
    // The first hour of the history is missing too (the logger was installed an hour late).
    await store(
      s.f,
      day0 + 3_600_000,
      3_600_000,
      Array.from({ length: 95 }, (_, h) => usual(h + 1)),
    );
    await evaluator().runOnce(day0 + 96 * 3_600_000);
    expect(await alertsOf(s.f)).toHaveLength(0);
    // Outage from 00:00 to 03:00 of day 5 (hours 96–98 never arrive); the first reading after it is 24 °C at 03:00.
    await store(s.f, day0 + 99 * 3_600_000, 3_600_000, [24, usual(100)]);
    await evaluator().runOnce(day0 + 101 * 3_600_000);
    const rows = await alertsOf(s.f);
    expect(rows.map((r) => [Number(r.opened_at), Number(r.opened_value), Number(r.resolved_at)])).toEqual([
      [day0 + 99 * 3_600_000, 24, day0 + 100 * 3_600_000],
    ]);
  });

  it('two evaluators on two servers in the same cycle: one runs, the other finds the cycle done; job_runs has one row; each notification is mailed once', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Cold room warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 8 } });
    const t0 = Date.now() - 3_600_000;
    await store(s.f, t0, 60_000, [5, 9, 5, 9, 5]); // opens twice, resolves twice
    const second = createDb(t.config.db);
    extraDbs.push(second);
    const clock = simulatedClock();
    const cycleMs = 30_000;
    const a = evaluator({ holder: 'server-a', clock: clock.now, cycleMs });
    const b = createAlertEvaluator({
      db: second,
      mailer,
      logger,
      publicUrl: t.config.publicUrl,
      reminderAfterMin: 0,
      holder: 'server-b',
      clock: clock.now,
      cycleMs,
    });
    // the two ticks fall 10 s apart in one 30 s cycle
    const cycleStart = Math.floor((t0 + 5 * 60_000) / cycleMs) * cycleMs;
    const [ra, rb] = await Promise.all([a.runOnce(cycleStart + 5_000), b.runOnce(cycleStart + 15_000)]);
    expect([ra.ran, rb.ran].sort()).toEqual([false, true]);
    const loser = ra.ran ? rb : ra;
    expect(loser.skipped).toBe('cycle-done');
    const rows = await cycleRows(cycleStart);
    expect(rows).toHaveLength(1);
    expect(rows[0].holder).toBe(ra.ran ? 'server-a' : 'server-b');
    expect(rows[0].finished_at).not.toBeNull();
    expect(await alertsOf(s.f)).toHaveLength(2);
    expect((await mailTo(s.watcher)).sort()).toEqual([
      `Alert: Cold room warm — Logger ${s.f.ids.loggerId} · Air temperature`,
      `Alert: Cold room warm — Logger ${s.f.ids.loggerId} · Air temperature`,
      `Resolved: Cold room warm — Logger ${s.f.ids.loggerId} · Air temperature`,
      `Resolved: Cold room warm — Logger ${s.f.ids.loggerId} · Air temperature`,
    ]);
    expect(Number((await t.db('notification_outbox').where({ tenant_id: s.f.lab.id }).count({ n: '*' }))[0].n)).toBe(4);
    // the next cycle runs again (on whichever server ticks first)
    const next = await b.runOnce(cycleStart + cycleMs + 1_000);
    expect(next.ran).toBe(true);
    expect(await cycleRows(cycleStart + cycleMs)).toHaveLength(1);
  });

  it('an after-ingest run in a cycle nobody has claimed does the whole cycle (silence rules too); the scheduled tick then finds it done', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Cold room warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 8 } });
    await makeRule(s, { name: 'Logger quiet', kind: 'silence', loggerId: s.f.ids.loggerId, params: { factor: 3 } });
    const t0 = Date.now() - 3_600_000;
    await store(s.f, t0, 60_000, [5, 9]); // one crossing; the logger then falls silent for an hour
    const cycleMs = 30_000;
    const nudged = evaluator({ holder: 'server-a', cycleMs });
    const scheduled = evaluator({ holder: 'server-b', cycleMs });
    const at = Math.floor(Date.now() / cycleMs) * cycleMs + 2_000 + 7 * cycleMs; // a cycle no other test has claimed
    // a server without the schedule (a tool, a test app) never runs a whole cycle because a batch arrived
    const other = await setup();
    await makeRule(other, { name: 'Cold room warm', kind: 'bounds', channelId: other.f.ids.channelId, params: { high: 8 } });
    await store(other.f, t0, 60_000, [5, 9]);
    expect(await evaluator({ holder: 'server-c', cycleMs }).evaluateChannels(other.f.lab.id, [other.f.ids.channelId], at)).toMatchObject({
      ran: true,
      opened: 1,
    });
    expect(await cycleRows(Math.floor(at / cycleMs) * cycleMs)).toHaveLength(0);
    nudged.takeCyclesFromNudges(true); // as the scheduled job does while it runs
    // the nudge names only the channel, yet the cycle's run judges the silence rule as well
    expect(await nudged.evaluateChannels(s.f.lab.id, [s.f.ids.channelId], at)).toMatchObject({ ran: true, opened: 2 });
    const rows = await cycleRows(Math.floor(at / cycleMs) * cycleMs);
    expect(rows.map((r) => [r.holder, r.finished_at !== null])).toEqual([['server-a', true]]);
    expect(await scheduled.runOnce(at + 10_000)).toMatchObject({ ran: false, skipped: 'cycle-done' });
    // later nudges in the same cycle judge just their channels (no second cycle run)
    await store(s.f, t0 + 2 * 60_000, 60_000, [5]);
    expect(await nudged.evaluateChannels(s.f.lab.id, [s.f.ids.channelId], at + 20_000)).toMatchObject({ ran: true, resolved: 1 });
    expect(await cycleRows(Math.floor(at / cycleMs) * cycleMs)).toHaveLength(1);
    expect((await alertsOf(s.f)).map((a) => a.resolved_at === null)).toEqual([false, true]);
  });

  it('an evaluator that cannot get the lease within its wait skips the run and claims no cycle', async () => {
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    const holding = createLeaseRunner({ db: t.db, holder: 'busy-server' }).run(EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS, () => held);
    await new Promise((r) => setTimeout(r, 100));
    const now = Date.now();
    const skipped = await evaluator({ lockWaitS: 0, cycleMs: 1 }).runOnce(now);
    expect(skipped).toMatchObject({ ran: false, skipped: 'busy' });
    expect(await cycleRows(now)).toHaveLength(0);
    release();
    expect((await holding).ran).toBe(true);
  });

  it('after-ingest evaluation waits for the lease (short jittered pauses) and runs once the holder lets go', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Freezer warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: -15 } });
    const t0 = Date.now() - 600_000;
    await store(s.f, t0, 60_000, [-20, -10]);
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    const holding = createLeaseRunner({ db: t.db, holder: 'busy-server' }).run(EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS, () => held);
    await new Promise((r) => setTimeout(r, 50));
    setTimeout(release, 400);
    const pauses: number[] = [];
    const sleep = (ms: number) => {
      pauses.push(ms);
      return new Promise<void>((r) => setTimeout(r, ms));
    };
    const run = await evaluator({ lockWaitS: 5, leaseWait: { sleep, pollMs: 50 } }).evaluateChannels(s.f.lab.id, [s.f.ids.channelId], t0 + 2 * 60_000);
    await holding;
    expect(run).toMatchObject({ ran: true, opened: 1 });
    expect(pauses.length).toBeGreaterThanOrEqual(3); // it waited ≈ 400 ms in pauses of 25–75 ms
    expect(pauses.every((ms) => ms >= 25 && ms < 75)).toBe(true);
    expect(new Set(pauses).size).toBeGreaterThan(1); // jittered, not in step
    expect(await alertsOf(s.f)).toHaveLength(1);
  });

  it('fencing: a stale holder whose lease was taken over cannot commit a rule change; the new holder can', async () => {
    const s = await setup();
    const ruleId = await makeRule(s, { name: 'Incubator warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 38 } });
    const t0 = Date.now() - 600_000;
    await store(s.f, t0, 60_000, [37, 39]);
    const clock = simulatedClock();
    const leaseClock = () => new Date(clock.now());
    const stale = createLeaseRunner({ db: t.db, holder: 'server-a', now: leaseClock });
    const fresh = createLeaseRunner({ db: t.db, holder: 'server-b', now: leaseClock });
    const ctx = { db: t.db, tenantId: s.f.lab.id, lab: { name: s.f.lab.name, slug: s.f.lab.slug }, publicUrl: t.config.publicUrl, now: t0 + 2 * 60_000 };
    const cursor = async () => (await t.db('alert_rules').where({ tenant_id: s.f.lab.id, id: ruleId }).first()).cursor_ts;
    const before = await cursor();
    const outcome = await stale.run(EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS, async (staleLease) => {
      clock.advance(EVALUATOR_LEASE_TTL_MS + 1); // server A stalls past its TTL …
      return fresh.run(EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS, async (freshLease) => {
        // … server B takes over, then A wakes up and tries to commit its step
        await expect(evaluateValueRule({ ...ctx, fence: (trx) => staleLease.fence(trx) }, ruleId)).rejects.toBeInstanceOf(LeaseLostError);
        const afterStale = { alerts: (await alertsOf(s.f)).length, cursor: await cursor() };
        const counts = await evaluateValueRule({ ...ctx, fence: (trx) => freshLease.fence(trx) }, ruleId);
        return { afterStale, counts, fencing: [staleLease.fencing, freshLease.fencing] };
      });
    });
    expect(outcome.ran && outcome.value.ran).toBe(true);
    if (!outcome.ran || !outcome.value.ran) return;
    const { afterStale, counts, fencing } = outcome.value.value;
    expect(afterStale).toEqual({ alerts: 0, cursor: before }); // nothing of the stale step was committed
    expect(counts).toEqual({ opened: 1, resolved: 0 });
    expect(fencing[1]).toBe(fencing[0] + 1);
    expect(await alertsOf(s.f)).toHaveLength(1);
  });

  it('a holder that crashed (never released) is replaced once its lease expires, with a higher fencing number', async () => {
    const clock = simulatedClock();
    const leases = jobLeasesRepo(t.db);
    const crashed = await leases.take(EVALUATOR_LEASE, 'crashed-server', new Date(clock.now()), new Date(clock.now() + EVALUATOR_LEASE_TTL_MS));
    expect(crashed.taken).toBe(true);
    if (!crashed.taken) return;
    const b = evaluator({ holder: 'server-b', clock: clock.now, lockWaitS: 0, cycleMs: 1 });
    const early = clock.now();
    expect(await b.runOnce(early)).toMatchObject({ ran: false, skipped: 'busy' });
    clock.advance(EVALUATOR_LEASE_TTL_MS - 1);
    expect(await b.runOnce(early + 1)).toMatchObject({ ran: false, skipped: 'busy' });
    clock.advance(1); // the lease expires now
    const later = clock.now();
    expect(await b.runOnce(later)).toMatchObject({ ran: true });
    const [row] = await cycleRows(later);
    expect(row.holder).toBe('server-b');
    expect(Number(row.fencing)).toBe(crashed.fencing + 1);
    expect(await cycleRows(early)).toHaveLength(0);
    expect((await leases.current(EVALUATOR_LEASE))?.holder).toBe(''); // released after the run
  });

  it('runs of one server take turns without waiting on the lease; a lease it failed to release is taken straight back by its next run', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Fridge warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 8 } });
    const t0 = Date.now() - 600_000;
    await store(s.f, t0, 60_000, [5, 9]);
    const a = evaluator({ holder: 'server-a', lockWaitS: 0, cycleMs: 1 });
    // the schedule and an ingestion nudge at once on one server: both run, one after the other
    const [scheduled, nudged] = await Promise.all([a.runOnce(t0 + 2 * 60_000), a.evaluateChannels(s.f.lab.id, [s.f.ids.channelId], t0 + 2 * 60_000)]);
    expect([scheduled.ran, nudged.ran]).toEqual([true, true]);
    expect(await alertsOf(s.f)).toHaveLength(1);
    // a release that never reached the database (it was failing over): the lease is still server-a's
    const leases = jobLeasesRepo(t.db);
    const stuck = await leases.take(EVALUATOR_LEASE, 'server-a', new Date(), new Date(Date.now() + EVALUATOR_LEASE_TTL_MS));
    expect(stuck.taken).toBe(true);
    const b = evaluator({ holder: 'server-b', lockWaitS: 0, cycleMs: 1 });
    expect(await b.runOnce(Date.now())).toMatchObject({ ran: false, skipped: 'busy' });
    expect(await a.runOnce(Date.now() + 1)).toMatchObject({ ran: true });
    expect((await leases.current(EVALUATOR_LEASE))?.holder).toBe(''); // and released after that run
  });

  it('an evaluator stopped mid-run and restarted loses nothing and doubles nothing', async () => {
    const s = await setup();
    const first = await makeRule(s, { name: 'A warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 8 } });
    const secondRule = await makeRule(s, { name: 'B warm', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 7 } });
    const t0 = Date.now() - 3_600_000;
    await store(s.f, t0, 60_000, [5, 9]);
    // the run dies inside the second rule's transaction (before its commit); which rule runs first is not fixed
    const mine = new Set([first, secondRule]);
    let committed = 0;
    const crashing = evaluator({
      beforeRuleCommit: (ruleId) => {
        if (mine.has(ruleId) && ++committed === 2) throw new Error('process killed');
      },
    });
    const stopped = await crashing.runOnce(t0 + 2 * 60_000);
    expect(stopped.errors).toBeGreaterThanOrEqual(1);
    const afterCrash = await alertsOf(s.f);
    expect(afterCrash).toHaveLength(1);
    expect(await mailTo(s.watcher)).toEqual([]); // queued with the alert, not sent yet
    await evaluator().runOnce(t0 + 3 * 60_000);
    const rows = await alertsOf(s.f);
    expect(rows.map((r) => Number(r.rule_id)).sort()).toEqual([first, secondRule].sort());
    expect((await mailTo(s.watcher)).sort()).toEqual([
      `Alert: A warm — Logger ${s.f.ids.loggerId} · Air temperature`,
      `Alert: B warm — Logger ${s.f.ids.loggerId} · Air temperature`,
    ]);
    await evaluator().runOnce(t0 + 4 * 60_000);
    expect(await mailTo(s.watcher)).toHaveLength(2);
  });

  it('a mail server that is down: the notification waits in the outbox and is retried with back-off, sent once', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Tank low', kind: 'bounds', channelId: s.f.ids.channelId, params: { low: 2 } });
    const t0 = Date.now() - 3_600_000;
    await store(s.f, t0, 60_000, [3, 1]);
    let tries = 0;
    const down: Mailer = {
      send: async (m) => {
        if (m.to === s.watcher.email) tries++;
        throw new Error('connect ECONNREFUSED 127.0.0.1:25');
      },
      verify: async () => false,
      close: () => undefined,
    };
    const now = t0 + 2 * 60_000;
    await evaluator({ mailer: down }).runOnce(now);
    expect(tries).toBe(1);
    const row = await t.db('notification_outbox').where({ tenant_id: s.f.lab.id }).first();
    expect([row.attempts, Number(row.next_attempt_at) - now, row.sent_at, row.last_error]).toEqual([1, 30_000, null, 'connect ECONNREFUSED 127.0.0.1:25']);
    await evaluator({ mailer: down }).runOnce(now + 10_000); // not due yet: no second try
    expect(tries).toBe(1);
    await evaluator({ mailer: down }).runOnce(now + 31_000); // due, still down: back-off doubles
    expect(tries).toBe(2);
    const row2 = await t.db('notification_outbox').where({ tenant_id: s.f.lab.id }).first();
    expect([row2.attempts, Number(row2.next_attempt_at) - (now + 31_000)]).toEqual([2, 60_000]);
    expect(await mailTo(s.watcher)).toEqual([]);
    await evaluator().runOnce(now + 92_000); // the server is back
    await evaluator().runOnce(now + 200_000);
    expect(await mailTo(s.watcher)).toEqual([`Alert: Tank low — Logger ${s.f.ids.loggerId} · Air temperature`]);
  });

  it('ingestion through POST /api/v1/ingest nudges the evaluator: the alert mail arrives without a scheduled run', async () => {
    const s = await setup();
    await makeRule(s, { name: 'Seed store humid', kind: 'bounds', channelId: s.f.ids.channelId, params: { high: 40 } });
    const ts = Date.now() - 60_000;
    await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${s.f.ingestKey}`)
      .send({ readings: [{ channel: 'air_t', ts, value: 55 }] })
      .expect(200);
    const mail = await waitForMail(captureUrl, (m) => m.to.includes(s.watcher.email), 8000);
    expect(mail.subject).toContain('Alert: Seed store humid');
    expect(mail.text).toContain('Reading: 55 °C at');
  });
});
