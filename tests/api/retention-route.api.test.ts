import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';

/**
 * `GET /api/v1/labs/:lab/billing/retention` through the app (issue #20 item 3): what an admin is
 * told on a plan that keeps everything and on one that removes readings, and the guard's
 * answers (401, 403 for a guest, 404 for another lab's member). The app reads a copy of the
 * shipped catalog where "transect" removes readings after 200 days of history and 10 export
 * days; the other plans keep everything, as shipped. The app runs on the real clock, so the
 * readings are placed relative to it.
 */
const DAY = 86_400_000;
let t: TestApp;

function writeCatalog(): string {
  const shipped = JSON.parse(readFileSync('tenants/plans.json', 'utf8')) as {
    plans: Array<{ key: string; limits: { historyDays: number }; readingRemoval: unknown }>;
  };
  for (const p of shipped.plans) {
    if (p.key !== 'transect') continue;
    p.limits.historyDays = 200;
    p.readingRemoval = { enabled: true, exportDays: 10 };
  }
  const path = join(mkdtempSync(join(tmpdir(), 'lagbook-retention-route-')), 'plans.json');
  writeFileSync(path, JSON.stringify(shipped));
  return path;
}

beforeAll(async () => {
  const base = testConfig();
  t = await buildTestApp({ stripe: { ...base.stripe, plansFile: writeCatalog() } });
});
afterAll(async () => t?.close());

const path = (lab: LabWithEverything) => `/api/v1/labs/${lab.lab.slug}/billing/retention`;
const cookieOf = (userId: number) => sessionCookieFor(t.db, t.config.sessionSecret, userId);

/** Readings every 6 hours over [from, to) with their day rollups, as ingestion leaves them. */
async function fill(lab: LabWithEverything, from: number, to: number): Promise<number> {
  const rows = [];
  for (let ts = from; ts < to; ts += 6 * 3_600_000) rows.push({ tenant_id: lab.lab.id, channel_id: lab.ids.channelId, ts, value: (ts / 3_600_000) % 7 });
  await t.db('readings').insert(rows);
  await t.db.raw(
    `INSERT INTO reading_rollups (tenant_id, channel_id, resolution_s, bucket_start, min_value, max_value, sum_value, count_value)
     SELECT tenant_id, channel_id, 86400, ts - MOD(ts, 86400000) AS b, MIN(value), MAX(value), SUM(value), COUNT(*) FROM readings
      WHERE tenant_id = ? AND ts >= ? AND ts < ? GROUP BY tenant_id, channel_id, b`,
    [lab.lab.id, from, to],
  );
  return rows.length;
}

describe('GET …/billing/retention', () => {
  it('tells an admin on a plan that keeps everything that nothing is removed', async () => {
    const lab = await buildLabWithEverything(t.db);
    const res = await request(t.app)
      .get(path(lab))
      .set('Cookie', await cookieOf(lab.founder.id))
      .expect(200);
    expect(res.body).toEqual({
      removes: false,
      planName: 'Seedling',
      historyDays: 90,
      sentence: 'The Seedling plan never removes readings: it shows the last 90 days, and older readings stay stored and show again with a longer plan.',
    });
  });

  it('tells an admin on a removing plan the horizon, the oldest reading, how many readings lie before it and when the next removal runs', async () => {
    const lab = await buildLabWithEverything(t.db);
    await t.db('lab_billing').insert({ tenant_id: lab.lab.id, plan_key: 'transect', status: 'active' });
    const startedAt = Date.now();
    // the horizon: the UTC day start of now − (200 + 10) days (computed here from the plan's terms)
    const horizon = Math.floor((startedAt - 210 * DAY) / DAY) * DAY;
    const oldest = horizon - 40 * DAY;
    const before = await fill(lab, oldest, horizon);
    await fill(lab, horizon, horizon + 20 * DAY);
    const res = await request(t.app)
      .get(path(lab))
      .set('Cookie', await cookieOf(lab.founder.id))
      .expect(200);
    expect(res.body).toMatchObject({
      removes: true,
      planName: 'Transect',
      historyDays: 200,
      exportDays: 10,
      horizon: new Date(horizon).toISOString(),
      oldestReading: new Date(oldest).toISOString(),
      readingsBeforeHorizon: before,
    });
    expect(before).toBe(160);
    expect(res.body.sentence).toBe(
      "The Transect plan removes readings 210 days after they were taken (its 200 days of history and 10 more for exporting them); 160 readings are due for removal. Export them first from the lab's settings.",
    );
    // the next removal: now (no run yet in this database) or a day after the latest run started — never in the past, at most a day ahead
    const next = Date.parse(res.body.nextRemovalAt);
    expect(next).toBeGreaterThanOrEqual(startedAt - 1000);
    expect(next).toBeLessThanOrEqual(Date.now() + DAY);
  });

  it('is for admins: 401 signed out, 403 for a guest, 404 for a member of another lab', async () => {
    const lab = await buildLabWithEverything(t.db);
    const other = await buildLabWithEverything(t.db);
    await request(t.app).get(path(lab)).expect(401);
    const guest = await request(t.app)
      .get(path(lab))
      .set('Cookie', await cookieOf(lab.guest.id));
    expect(guest.status).toBe(403);
    await request(t.app)
      .get(path(lab))
      .set('Cookie', await cookieOf(other.founder.id))
      .expect(404);
  });
});
