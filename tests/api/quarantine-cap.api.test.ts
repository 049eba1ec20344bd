import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildMember, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { TEST_LIMITS, writeTestPlanCatalog } from '../support/stripe-test-billing.ts';
import { QUARANTINE_COUNT_LIMIT } from '../../server/db/quarantine.repo.ts';

/**
 * Quarantine bounded and counted (issue 15, finding 2, per lab): the plan's `quarantinedRows`
 * cap (test catalog: free plan 3 rows), the count kept in lab_billing and shown on the billing
 * page, keyset pages instead of page numbers.
 */
const CAP = TEST_LIMITS.free.quarantinedRows;
const T0 = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 86_400_000;
let t: TestApp;

beforeAll(async () => {
  t = await buildTestApp({ stripe: { ...testConfig().stripe, plansFile: writeTestPlanCatalog() } });
});
afterAll(async () => t?.close());

interface Lab {
  f: LabWithEverything;
  admin: string;
  tech: string;
  path: (p?: string) => string;
}

/** A lab whose quarantine starts empty (the fixture's hand-inserted row is removed). */
async function newLab(): Promise<Lab> {
  const f = await buildLabWithEverything(t.db);
  await t.db('quarantined_rows').where({ tenant_id: f.lab.id }).delete();
  const technician = await buildMember(t.db, f.lab, { role: 'technician' });
  return {
    f,
    admin: await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id),
    tech: await sessionCookieFor(t.db, t.config.sessionSecret, technician.id),
    path: (p = '') => `/api/v1/labs/${f.lab.slug}${p}`,
  };
}

/** A batch of `good` readings (from reading number `from`) and `bad` rows for a channel the logger lacks. */
function ingest(lab: Lab, from: number, good: number, bad: number) {
  const readings = [
    ...Array.from({ length: good }, (_, i) => ({ channel: 'air_t', ts: T0 + (from + i) * 1000, value: from + i })),
    ...Array.from({ length: bad }, (_, i) => ({ channel: 'leaf_wetness', ts: T0 + i * 1000, value: i })),
  ];
  return request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${lab.f.ingestKey}`).send({ readings });
}

const stored = async (lab: Lab) => Number((await t.db('readings').where('tenant_id', lab.f.lab.id).count({ n: '*' }).first())?.n);
const quarantined = async (lab: Lab) => Number((await t.db('quarantined_rows').where('tenant_id', lab.f.lab.id).count({ n: '*' }).first())?.n);
const billingUsage = async (lab: Lab) => (await request(t.app).get(lab.path('/billing')).set('Cookie', lab.admin).expect(200)).body;

describe(`per-lab quarantine cap (free plan here: ${CAP} rows)`, () => {
  it('takes rows up to the cap exactly, then refuses a batch with more with 402 + Retry-After and stores nothing of it', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 2, 2)).status).toBe(200);
    expect((await ingest(lab, 2, 1, CAP - 2)).status).toBe(200); // exactly at the cap
    const refused = await ingest(lab, 3, 2, 1);
    expect(refused.status).toBe(402);
    expect(refused.headers['retry-after']).toBe('3600');
    expect(refused.body.error.code).toBe('plan_limit_reached');
    expect(refused.body.error.message).toBe(
      `The lab's Seedling plan allows ${CAP} quarantined rows; ${CAP} are in use and this would add 1. Nothing of this batch was saved, its good readings included. ` +
        'A technician can make room by discarding or re-submitting quarantined rows, or a lab admin can raise the limit under Billing; retry after that.',
    );
    expect([await stored(lab), await quarantined(lab)]).toEqual([3, CAP]);
    // a batch without bad rows is not held up by a full quarantine
    expect((await ingest(lab, 3, 2, 0)).status).toBe(200);
    expect(await stored(lab)).toBe(5);

    const billing = await billingUsage(lab);
    expect([billing.usage.quarantinedRows, billing.limits.quarantinedRows]).toEqual([CAP, CAP]);
  });

  it('a technician makes room by discarding; re-submitting rows that fail again does not need room', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 0, CAP)).status).toBe(200);
    const rows = (await request(t.app).get(lab.path('/quarantine')).set('Cookie', lab.tech).expect(200)).body.rows as Array<{ id: number }>;
    expect(rows).toHaveLength(CAP);

    // at the cap: re-submitting two rows that are still bad replaces them (net growth 0)
    const again = await request(t.app)
      .post(lab.path('/quarantine/resubmit'))
      .set('Cookie', lab.tech)
      .send({ rows: rows.slice(0, 2).map((r) => ({ id: r.id, channel: 'leaf_wetness', ts: T0, value: 1 })) })
      .expect(200);
    expect(again.body.quarantined).toHaveLength(2);
    expect(await quarantined(lab)).toBe(CAP);
    expect((await ingest(lab, 0, 1, 1)).status).toBe(402);

    await request(t.app)
      .post(lab.path('/quarantine/discard'))
      .set('Cookie', lab.tech)
      .send({ ids: [rows[CAP - 1].id] })
      .expect(200);
    expect((await billingUsage(lab)).usage.quarantinedRows).toBe(CAP - 1);
    expect((await ingest(lab, 0, 1, 1)).status).toBe(200);
    expect([await stored(lab), await quarantined(lab), (await billingUsage(lab)).usage.quarantinedRows]).toEqual([1, CAP, CAP]);
  });
});

describe('quarantine count', () => {
  it('starts from the rows already there when the lab first gets its billing row (rows written without the hooks, as the demo seed does)', async () => {
    const f = await buildLabWithEverything(t.db); // one quarantined row inserted directly, no billing row yet
    const admin = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
    const lab: Lab = { f, admin, tech: admin, path: (p = '') => `/api/v1/labs/${f.lab.slug}${p}` };
    expect(await t.db('lab_billing').where({ tenant_id: f.lab.id }).first()).toBeUndefined();
    expect((await ingest(lab, 0, 1, 1)).status).toBe(200);
    expect([(await billingUsage(lab)).usage.quarantinedRows, await quarantined(lab)]).toEqual([2, 2]);
  });
});

describe('quarantine list: keyset pages', () => {
  it('walks every row once with nextCursor, newest batch first and a batch in row order, with filters', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 0, 2)).status).toBe(200);
    await new Promise((r) => setTimeout(r, 5)); // a later received_at for the second batch
    const second = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${lab.f.ingestKey}`)
      .send({ readings: [{ channel: 'air_t', ts: T0, value: 'warm' }] });
    expect(second.status).toBe(200);

    const seen: Array<{ id: number; reasonCode: string; rowIndex: number }> = [];
    let cursor: string | null = null;
    for (let pages = 0; pages < 5; pages++) {
      const res: request.Response = await request(t.app)
        .get(lab.path(`/quarantine?pageSize=2${cursor ? `&cursor=${cursor}` : ''}`))
        .set('Cookie', lab.tech)
        .expect(200);
      expect(res.body.total).toBe(3);
      expect(res.body.totalAtLeast).toBe(false);
      seen.push(...res.body.rows);
      cursor = res.body.nextCursor;
      if (!cursor) break;
    }
    expect(seen.map((r) => [r.reasonCode, r.rowIndex])).toEqual([
      ['bad_value', 0],
      ['unknown_channel', 0],
      ['unknown_channel', 1],
    ]);
    expect(new Set(seen.map((r) => r.id)).size).toBe(3);

    const filtered = await request(t.app).get(lab.path('/quarantine?reason=unknown_channel&pageSize=1')).set('Cookie', lab.tech).expect(200);
    expect([filtered.body.total, filtered.body.rows[0].rowIndex, typeof filtered.body.nextCursor]).toEqual([2, 0, 'string']);
    const last = await request(t.app)
      .get(lab.path(`/quarantine?reason=unknown_channel&pageSize=1&cursor=${filtered.body.nextCursor}`))
      .set('Cookie', lab.tech)
      .expect(200);
    expect([last.body.rows[0].rowIndex, last.body.nextCursor]).toEqual([1, null]);
  });

  it('counts matching rows up to 10,000 and says when there are more', async () => {
    const lab = await newLab();
    const rows = Array.from({ length: QUARANTINE_COUNT_LIMIT + 1 }, (_, i) => ({
      tenant_id: lab.f.lab.id,
      id: i + 1,
      logger_id: lab.f.ids.loggerId,
      source: 'api',
      row_index: i,
      reason_code: 'unknown_channel',
      reason: 'channel: no channel "x" on this logger',
    }));
    for (let i = 0; i < rows.length; i += 2000) await t.db('quarantined_rows').insert(rows.slice(i, i + 2000));
    const res = await request(t.app).get(lab.path('/quarantine?pageSize=1')).set('Cookie', lab.tech).expect(200);
    expect([res.body.total, res.body.totalAtLeast]).toEqual([QUARANTINE_COUNT_LIMIT, true]);
    const one = await request(t.app).get(lab.path('/quarantine?reason=bad_value')).set('Cookie', lab.tech).expect(200);
    expect([one.body.total, one.body.totalAtLeast, one.body.nextCursor]).toEqual([0, false, null]);
  });

  it('refuses page numbers and made-up cursors with 400 and the field named', async () => {
    const lab = await newLab();
    const paged = await request(t.app).get(lab.path('/quarantine?page=50000')).set('Cookie', lab.tech).expect(400);
    expect(paged.body.error).toMatchObject({ code: 'invalid_input', message: 'Page number: pages are reached with the list\'s "more" link, not by number.' });
    for (const bad of ['abc', '1.2', '1.2.3.4', '99999999999999999.1.1']) {
      const res = await request(t.app)
        .get(lab.path(`/quarantine?cursor=${bad}`))
        .set('Cookie', lab.tech)
        .expect(400);
      expect(res.body.error.message).toBe('Page: is not a page of this list (open the list again from its first page).');
    }
  });
});
