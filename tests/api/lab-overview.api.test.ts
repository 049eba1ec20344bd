/**
 * The lab overview (`GET …/overview`) on the real MariaDB: each attention item appears when its
 * condition holds and not otherwise, parts follow the caller's role, an empty lab gets its first
 * steps, and another lab's rows are never counted. Readings go in through the real ingest and
 * upload endpoints; time is a simulated clock handed to a second app on the same database. The
 * plan catalog is the billing tests' copy with tiny limits (free: 10 readings, 2 loggers, 4 seats,
 * 3 quarantined rows), so "near the limit" is reached with a few readings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor, standInAppDeps } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { writeTestPlanCatalog } from '../support/stripe-test-billing.ts';
import { createApp } from '../../server/app.ts';
import type { LabOverviewAnswer } from '../../server/contract/overview.ts';
import type { Role } from '../../server/policies/permissions.ts';

const MIN = 60_000;
let t: TestApp;
/** The same app on the same database, its clock set by the test (`clock`). */
let clocked: Express;
let clock = Math.floor(Date.now() / MIN) * MIN - 60 * MIN;

beforeAll(async () => {
  const base = testConfig();
  t = await buildTestApp({ stripe: { ...base.stripe, plansFile: writeTestPlanCatalog() } });
  clocked = createApp(standInAppDeps(t, { now: () => new Date(clock) }));
});
afterAll(async () => t?.close());

const cookieAs = async (f: { lab: LabWithEverything['lab'] }, role: Role) =>
  sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, f.lab, { role })).id);

async function overviewOf(slug: string, cookie: string, app: Express = clocked): Promise<LabOverviewAnswer> {
  return (await request(app).get(`/api/v1/labs/${slug}/overview`).set('Cookie', cookie).expect(200)).body as LabOverviewAnswer;
}

function ingest(f: LabWithEverything, readings: Array<{ ts: number; value: number | string }>) {
  return request(clocked)
    .post('/api/v1/ingest')
    .set('Authorization', `Bearer ${f.ingestKey}`)
    .send({ readings: readings.map((r) => ({ channel: 'air_t', ...r })) });
}

const usageOf = (o: LabOverviewAnswer, measure: string) => o.plan!.usage.find((u) => u.measure === measure);

describe('GET /overview: each attention item when its condition holds', () => {
  let f: LabWithEverything;
  let admin: string;
  beforeAll(async () => {
    f = await buildLabWithEverything(t.db);
    admin = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  });

  it('a lab whose logger never sent anything: its key is listed as never used, nothing else needs attention', async () => {
    const o = await overviewOf(f.lab.slug, admin);
    expect(o).toMatchObject({ empty: false, loggerCount: 1, firstSteps: [], now: new Date(clock).toISOString() });
    expect(o.channels).toMatchObject({ total: 1, counts: { 'no-data': 1, live: 0, silent: 0, 'out-of-range': 0 }, silent: [], outOfRange: [] });
    expect(o.alerts).toEqual({ openCount: 0, recent: [] }); // the fixture's alert is resolved
    expect(o.quarantine).toEqual({ waiting: 0, byReason: [] }); // no counted row yet (the fixture writes its row around the counter)
    expect(o.keys).toMatchObject({ neverUsedCount: 1, withoutKeyCount: 0, withoutKey: [] });
    expect(o.keys!.neverUsed[0].logger).toEqual({ id: f.ids.loggerId, name: `Logger ${f.ids.loggerId}` });
    expect(o.plan!.usage.map((u) => u.level)).toEqual([0, 0, 0, 0]);
    expect(o.lastUpload).toBeNull();
  });

  it('readings through the key: the key is no longer unused and the channel is live', async () => {
    await ingest(
      f,
      [1, 2, 3].map((i) => ({ ts: clock - (3 - i) * MIN, value: 20 + i })),
    ).expect(200);
    const o = await overviewOf(f.lab.slug, admin);
    expect(o.keys).toMatchObject({ neverUsed: [], neverUsedCount: 0 });
    expect(o.channels!.counts).toMatchObject({ live: 1, silent: 0 });
  });

  it('silent once more than 3 expected intervals pass on the clock (the channels page rule), live again after a reading', async () => {
    clock += 3 * MIN; // exactly 3 × 60 s since the last reading: not yet silent
    expect((await overviewOf(f.lab.slug, admin)).channels!.silent).toEqual([]);
    clock += 1000;
    let o = await overviewOf(f.lab.slug, admin);
    expect(o.channels!.silent).toHaveLength(1);
    expect(o.channels!.silent[0]).toMatchObject({
      id: f.ids.channelId,
      key: 'air_t',
      status: 'silent',
      intervalS: 60,
      logger: { id: f.ids.loggerId },
      lastReading: { time: new Date(clock - 3 * MIN - 1000).toISOString(), value: 23 },
    });
    // the channels page says the same at the same moment
    const page = await request(clocked).get(`/api/v1/labs/${f.lab.slug}/channels`).set('Cookie', admin).expect(200);
    expect(page.body.channels[0].status).toBe('silent');
    await ingest(f, [{ ts: clock, value: 24 }]).expect(200);
    o = await overviewOf(f.lab.slug, admin);
    expect(o.channels!.silent).toEqual([]);
    expect(o.channels!.counts.live).toBe(1);
  });

  it('out of range when the latest value lies outside the valid range, and not inside it', async () => {
    await t.db('channels').where({ tenant_id: f.lab.id, id: f.ids.channelId }).update({ valid_min: 0, valid_max: 23.5 });
    let o = await overviewOf(f.lab.slug, admin);
    expect(o.channels!.outOfRange).toHaveLength(1);
    expect(o.channels!.outOfRange[0]).toMatchObject({ id: f.ids.channelId, status: 'out-of-range', validMin: 0, validMax: 23.5, lastReading: { value: 24 } });
    await t.db('channels').where({ tenant_id: f.lab.id, id: f.ids.channelId }).update({ valid_max: 30 });
    o = await overviewOf(f.lab.slug, admin);
    expect(o.channels!.outOfRange).toEqual([]);
  });

  it('an open alert is counted and listed with its channel; resolved ones are not', async () => {
    const id = f.ids.alertId + 1;
    await t.db('alerts').insert({
      tenant_id: f.lab.id,
      id,
      rule_id: f.ids.ruleId,
      open_rule_id: f.ids.ruleId,
      rule_name: 'Air too warm',
      kind: 'bounds',
      channel_id: f.ids.channelId,
      logger_id: f.ids.loggerId,
      opened_at: clock - MIN,
      opened_value: 31,
      opened_detail: '31 is above the high limit 30',
      last_notified_at: clock - MIN,
    });
    const o = await overviewOf(f.lab.slug, admin);
    expect(o.alerts!.openCount).toBe(1);
    expect(o.alerts!.recent).toEqual([
      {
        id,
        ruleName: 'Air too warm',
        openedAt: new Date(clock - MIN).toISOString(),
        detail: '31 is above the high limit 30',
        acknowledged: false,
        channel: { id: f.ids.channelId, label: 'Air temperature' },
        // with the logger's zone, so the page can show the time on the logger's clock
        logger: { id: f.ids.loggerId, name: `Logger ${f.ids.loggerId}`, timezone: 'UTC' },
      },
    ]);
  });

  it('quarantined rows: the kept count and the reasons with their rows, linked by reason', async () => {
    const res = await ingest(f, [{ ts: clock, value: 'warm' }]).expect(200);
    expect(res.body.quarantined).toHaveLength(1);
    const o = await overviewOf(f.lab.slug, admin);
    // the counter starts from the rows already there (the fixture's) when the lab's billing row is made
    expect(o.quarantine!.waiting).toBe(2);
    expect(o.quarantine!.byReason).toEqual([{ reason: 'bad_value', count: 2, atLeast: false, latestAt: expect.any(String) }]);
  });

  it('usage against the plan: readings at 80% of the free plan reach the warning level the billing mails use', async () => {
    let o = await overviewOf(f.lab.slug, admin);
    expect(usageOf(o, 'readings')).toEqual({ measure: 'readings', used: 4, allowed: 10, level: 0 });
    // the same figures GET …/billing reports
    const billing = (await request(clocked).get(`/api/v1/labs/${f.lab.slug}/billing`).set('Cookie', admin).expect(200)).body;
    expect(o.plan!.planName).toBe(billing.plan.name);
    expect(usageOf(o, 'members')).toMatchObject({ used: billing.usage.members, allowed: billing.limits.members });
    await ingest(
      f,
      [1, 2, 3, 4].map((i) => ({ ts: clock - 30 * MIN + i * 1000, value: 20 })),
    ).expect(200);
    o = await overviewOf(f.lab.slug, admin);
    expect(usageOf(o, 'readings')).toEqual({ measure: 'readings', used: 8, allowed: 10, level: 80 });
  });

  it('the last upload: when, which logger, who and how many rows', async () => {
    const options = { format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' };
    const body = `channel,ts,value\nair_t,${new Date(clock - 50 * MIN).toISOString()},19.5\nair_t,${new Date(clock - 49 * MIN).toISOString()},oops\n`;
    await request(clocked)
      .post(`/api/v1/labs/${f.lab.slug}/loggers/${f.ids.loggerId}/uploads?options=${encodeURIComponent(JSON.stringify(options))}`)
      .set('Cookie', admin)
      .set('Content-Type', 'text/csv')
      .send(body)
      .expect(200);
    const o = await overviewOf(f.lab.slug, admin);
    expect(o.lastUpload).toMatchObject({
      logger: { id: f.ids.loggerId, name: `Logger ${f.ids.loggerId}`, timezone: 'UTC' },
      by: { name: f.founder.displayName },
      lines: 2,
      accepted: 1,
      duplicates: 0,
      quarantined: 1,
      stopped: false,
    });
    expect(Math.abs(Date.parse(o.lastUpload!.at) - Date.now())).toBeLessThan(10 * MIN); // recorded by the database clock
  });

  it('a logger without a working key is listed; revoking the only key moves a logger there', async () => {
    await t.db('ingest_keys').where({ tenant_id: f.lab.id, id: f.ids.keyId }).update({ revoked_at: new Date() });
    const o = await overviewOf(f.lab.slug, admin);
    expect(o.keys).toMatchObject({ neverUsedCount: 0, withoutKeyCount: 1 });
    expect(o.keys!.withoutKey[0].logger.id).toBe(f.ids.loggerId);
  });
});

describe('GET /overview: a large quarantine', () => {
  it('lists every reason latest first and counts each up to 1,000 ("or more" beyond); the waiting total is the kept counter', async () => {
    const f = await buildLabWithEverything(t.db); // one bad_value row, received now
    const old = Date.now() - 86_400_000;
    await t.db('quarantined_rows').insert(
      Array.from({ length: 1001 }, (_, i) => ({
        tenant_id: f.lab.id,
        id: 8e12 + f.lab.id * 2000 + i,
        source: 'upload',
        row_index: i,
        reason_code: 'bad_time',
        reason: 'time: cannot be read',
        received_at: new Date(old - i * 1000),
      })),
    );
    await t.db('lab_billing').insert({ tenant_id: f.lab.id, plan_key: 'seedling', quarantined_count: 1002 });
    const o = await overviewOf(f.lab.slug, await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id), t.app);
    expect(o.quarantine!.waiting).toBe(1002);
    expect(o.quarantine!.byReason.map(({ reason, count, atLeast }) => ({ reason, count, atLeast }))).toEqual([
      { reason: 'bad_value', count: 1, atLeast: false },
      { reason: 'bad_time', count: 1000, atLeast: true },
    ]);
    expect(o.quarantine!.byReason[1].latestAt).toBe(new Date(old).toISOString());
  });
});

describe('GET /overview: what each role gets', () => {
  it('a guest and a scientist get channels and alerts only; a technician also quarantine, keys and the last upload; billing only for admins', async () => {
    const f = await buildLabWithEverything(t.db);
    const parts = (o: LabOverviewAnswer) => ['channels', 'alerts', 'quarantine', 'keys', 'plan', 'lastUpload'].filter((k) => k in o);
    expect(parts(await overviewOf(f.lab.slug, await sessionCookieFor(t.db, t.config.sessionSecret, f.guest.id), t.app))).toEqual(['channels', 'alerts']);
    expect(parts(await overviewOf(f.lab.slug, await cookieAs(f, 'scientist'), t.app))).toEqual(['channels', 'alerts']);
    expect(parts(await overviewOf(f.lab.slug, await cookieAs(f, 'technician'), t.app))).toEqual(['channels', 'alerts', 'quarantine', 'keys', 'lastUpload']);
    expect(parts(await overviewOf(f.lab.slug, await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id), t.app))).toEqual([
      'channels',
      'alerts',
      'quarantine',
      'keys',
      'plan',
      'lastUpload',
    ]);
  });

  it('401 when not signed in, 404 for a lab the caller is not a member of', async () => {
    const f = await buildLabWithEverything(t.db);
    const other = await buildLabWithEverything(t.db);
    await request(t.app).get(`/api/v1/labs/${f.lab.slug}/overview`).expect(401);
    const res = await request(t.app)
      .get(`/api/v1/labs/${f.lab.slug}/overview`)
      .set('Cookie', await sessionCookieFor(t.db, t.config.sessionSecret, other.founder.id))
      .expect(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('GET /overview: an empty lab', () => {
  it('says so and offers the first steps the role may take', async () => {
    const lab = await buildLab(t.db);
    const roles: Array<[Role, string[]]> = [
      ['admin', ['register-logger', 'invite-colleague', 'upload-history']],
      ['technician', ['register-logger', 'upload-history']],
      ['scientist', []],
      ['guest', []],
    ];
    for (const [role, steps] of roles) {
      const o = await overviewOf(lab.slug, await cookieAs({ lab }, role), t.app);
      expect(o, role).toMatchObject({ empty: true, loggerCount: 0, firstSteps: steps });
      expect(o.channels, role).toMatchObject({ total: 0, silent: [], outOfRange: [] });
    }
  });

  it('a lab whose only logger is retired is empty again', async () => {
    const f = await buildLabWithEverything(t.db);
    await t.db('loggers').where({ tenant_id: f.lab.id, id: f.ids.loggerId }).update({ retired_at: new Date() });
    const o = await overviewOf(f.lab.slug, await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id), t.app);
    expect(o).toMatchObject({ empty: true, loggerCount: 0, firstSteps: ['register-logger', 'invite-colleague', 'upload-history'] });
  });
});

describe('GET /overview: another lab is never counted', () => {
  it("a lab's overview is unchanged while another lab gets silent channels, open alerts, quarantine, unused keys and uploads", async () => {
    const a = await buildLabWithEverything(t.db);
    const b = await buildLabWithEverything(t.db);
    const cookieA = await sessionCookieFor(t.db, t.config.sessionSecret, a.founder.id);
    const cookieB = await sessionCookieFor(t.db, t.config.sessionSecret, b.founder.id);
    const before = await overviewOf(a.lab.slug, cookieA);

    await ingest(b, [
      { ts: clock - 10 * MIN, value: 5 },
      { ts: clock - 10 * MIN + 1000, value: 'bad' },
    ]).expect(200);
    await t.db('alerts').insert({
      tenant_id: b.lab.id,
      id: b.ids.alertId + 1,
      rule_id: b.ids.ruleId,
      open_rule_id: b.ids.ruleId,
      rule_name: 'Air too warm',
      kind: 'bounds',
      channel_id: b.ids.channelId,
      opened_at: clock,
      opened_value: 31,
      opened_detail: 'x',
      last_notified_at: clock,
    });
    await t.db('loggers').insert({ tenant_id: b.lab.id, id: b.ids.loggerId + 1, name: 'Keyless', timezone: 'UTC', expected_interval_s: 60 });
    await request(clocked)
      .post(
        `/api/v1/labs/${b.lab.slug}/loggers/${b.ids.loggerId}/uploads?options=${encodeURIComponent(JSON.stringify({ format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' }))}`,
      )
      .set('Cookie', cookieB)
      .set('Content-Type', 'text/csv')
      .send(`channel,ts,value\nair_t,${new Date(clock - 20 * MIN).toISOString()},1\n`)
      .expect(200);

    const seenByB = await overviewOf(b.lab.slug, cookieB);
    expect(seenByB.channels!.silent).toHaveLength(1);
    expect(seenByB.alerts!.openCount).toBe(1);
    expect(seenByB.quarantine!.waiting).toBeGreaterThan(0);
    expect(seenByB.keys!.withoutKeyCount).toBe(1);
    expect(seenByB.lastUpload).not.toBeNull();

    expect(await overviewOf(a.lab.slug, cookieA)).toEqual(before);
  });
});
