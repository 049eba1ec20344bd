import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../server/db/create-db.ts';
import { migrateToLatest } from '../../server/db/migrate.ts';
import { seedDemo } from '../../server/cli/seed-demo.ts';
import { ccf, channelDiagnostics, detectPeriod, identifyProcess } from '../../server/analysis/index.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';
import { testConfig } from '../support/test-app.ts';

/**
 * The demo lab is loaded once per database, and its channels carry the structures the
 * scenario (tenants/demo/scenario.ts) promises, as Lagbook's own engine sees them.
 */
const config = testConfig();
const scratch = `${config.db.database}_demo`;
const END = Date.UTC(2026, 11, 1, 12, 0);
const DAY = 86_400_000;
let admin: Db;
let db: Db;
let labId: number;
const people = DEV_ACCOUNTS.map((a) => ({ email: a.email, name: a.name, subject: a.sub }));

async function series(loggerName: string, key: string): Promise<{ ts: number[]; values: number[] }> {
  const rows = await db('readings')
    .join('channels', function joinChannel() {
      this.on('channels.tenant_id', 'readings.tenant_id').andOn('channels.id', 'readings.channel_id');
    })
    .join('loggers', function joinLogger() {
      this.on('loggers.tenant_id', 'channels.tenant_id').andOn('loggers.id', 'channels.logger_id');
    })
    .where({ 'readings.tenant_id': labId, 'loggers.name': loggerName, 'channels.channel_key': key })
    .orderBy('readings.ts')
    .select('readings.ts', 'readings.value');
  return { ts: rows.map((r: { ts: number }) => Number(r.ts)), values: rows.map((r: { value: number }) => r.value) };
}

beforeAll(async () => {
  admin = createDb(config.db);
  await admin.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin.raw(`CREATE DATABASE \`${scratch}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = createDb({ ...config.db, database: scratch });
  await migrateToLatest(db);
}, 120_000);
afterAll(async () => {
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${scratch}\``);
  await admin?.destroy();
});

describe('demo lab seed', () => {
  it('loads the lab once; a second run changes nothing', async () => {
    const first = await seedDemo(db, { issuer: config.oidc.issuer, people, end: END });
    expect(first.seeded).toBe(true);
    expect(first.readings).toBeGreaterThan(300_000);
    expect(first.quarantined).toBe(5);
    labId = Number((await db('labs').where({ slug: 'fernhollow-field-station' }).first()).id);
    const count = async () => Number((await db('readings').where({ tenant_id: labId }).count({ n: '*' }))[0].n);
    const before = await count();
    // the plan's usage meter already counts every stored reading (no wait for the usage job)
    expect(Number((await db('lab_billing').where({ tenant_id: labId }).first()).readings_count)).toBe(before);
    const second = await seedDemo(db, { issuer: config.oidc.issuer, people, end: END });
    expect(second.seeded).toBe(false);
    expect(await count()).toBe(before);
  }, 120_000);

  it('has members in each role, as the local identity provider knows them', async () => {
    const rows = await db('memberships')
      .join('users', 'users.id', 'memberships.user_id')
      .where('memberships.tenant_id', labId)
      .select('users.email', 'memberships.role', 'users.oidc_issuer', 'users.email_verified');
    expect(rows.map((r: { role: string }) => r.role).sort()).toEqual(['admin', 'guest', 'scientist', 'technician']);
    for (const r of rows) expect([r.oidc_issuer, Boolean(r.email_verified)]).toEqual([config.oidc.issuer, true]);
  });

  it('the glasshouse air temperature carries a daily cycle (288 five-minute steps)', async () => {
    const { values } = await series('Glasshouse 2 climate', 'air_t');
    expect(detectPeriod(values.slice(-8064)).best).toBe(288);
  });

  it('the water bath is persistent: identified as AR(1)', async () => {
    const { values } = await series('Water bath B', 'bath_t');
    const id = identifyProcess(values.slice(-8000));
    expect([id.verdict, id.p]).toEqual(['ar', 1]);
  });

  it('soil moisture answers irrigation hours later (cross-correlation peaks at a positive lag)', async () => {
    const moisture = (await series('North plot soil station', 'soil_moisture')).values.slice(-8000);
    const irrigation = (await series('North plot soil station', 'irrigation')).values.slice(-8000);
    const r = ccf(moisture, irrigation, { maxLag: 200 });
    let best = 0;
    for (let i = 0; i < r.lags.length; i++) if (r.values[i] > r.values[best]) best = i;
    const hours = (r.lags[best] * 5) / 60;
    expect(hours).toBeGreaterThan(2);
    expect(hours).toBeLessThan(12);
  });

  /** The last `days` of a channel as the diagnostics read them. */
  async function lastDays(loggerName: string, key: string, days: number) {
    const s = await series(loggerName, key);
    const from = s.ts.findIndex((t) => t >= s.ts.at(-1)! - days * DAY);
    return { timestamps: s.ts.slice(from), values: s.values.slice(from) };
  }

  it('the diagnostics conclusions a scientist reads on the demo are right (30 days, 5-minute steps)', async () => {
    // soil moisture follows watering by hours, in the same direction (the scenario's delay kernel peaks at 3.5 h and the level then drains over a day)
    const soil = channelDiagnostics(
      await lastDays('North plot soil station', 'soil_moisture', 30),
      { step: 300_000, agg: 'mean', labels: { channel: 'Soil moisture', partner: 'Irrigation flow' } },
      await lastDays('North plot soil station', 'irrigation', 30),
    );
    const cross = soil.crossCorrelation!;
    expect(cross.method).toBe('prewhitened');
    expect(cross.strongest!.significant).toBe(true);
    expect(cross.strongest!.value).toBeGreaterThan(0);
    expect(cross.strongest!.lagMs).toBeGreaterThanOrEqual(2 * 3_600_000);
    expect(cross.strongest!.lagMs).toBeLessThanOrEqual(10 * 3_600_000);
    expect(cross.explanation).toMatch(/Soil moisture follows Irrigation flow by about \d+(\.\d)? h, and the two move in the same direction/);
    // the glasshouse air temperature: exactly one day of 5-minute steps, and a model for what is left after it
    const air = channelDiagnostics(await lastDays('Glasshouse 2 climate', 'air_t', 30), { step: 300_000, agg: 'mean' });
    expect(air.period).toMatchObject({ used: 288, source: 'detected' });
    expect(air.identification).toMatchObject({ verdict: 'seasonal', period: 288 });
    expect(air.identification.model).toMatchObject({ fittedOn: 'remainder' });
    // the water bath: no cycle, persistent AR(1), and a trend whose honest interval is far wider than the naive one
    const bath = channelDiagnostics(await lastDays('Water bath B', 'bath_t', 30), { step: 300_000, agg: 'mean' });
    expect(bath.period.used).toBeNull();
    expect(bath.identification).toMatchObject({ verdict: 'ar', p: 1 });
    if (!bath.trend.available) throw new Error('expected a trend');
    expect(bath.trend.interval[1] - bath.trend.interval[0]).toBeGreaterThan(3 * (bath.trend.intervalOls[1] - bath.trend.intervalOls[0]));
  }, 120_000);

  it('the brook gauge went silent nine days before the end; the cold-room probe drifted out of range', async () => {
    const brook = await series('Fern Brook gauge', 'level');
    expect(END - brook.ts.at(-1)!).toBeGreaterThanOrEqual(9 * DAY);
    const cold = await series('Cold room 3', 'air_t');
    expect(cold.values.at(-1)!).toBeGreaterThan(8);
    expect(Math.max(...cold.values.slice(0, 1000))).toBeLessThan(8);
  });

  it('keeps the firmware hiccup in quarantine with reasons', async () => {
    const codes = await db('quarantined_rows').where({ tenant_id: labId }).orderBy('row_index').pluck('reason_code');
    expect(codes).toEqual(['bad_time', 'bad_time', 'unknown_channel', 'bad_value', 'bad_value']);
  });
});
