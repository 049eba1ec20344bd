import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { buildMember, buildUser, sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { eventually, writeTestPlanCatalog } from '../support/stripe-test-billing.ts';
import { waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { LAB_OWNED_TABLES } from '../../server/db/tenant-scope.ts';
import { DELETION_ORDER } from '../../server/services/lab-deletion/deletion-order.ts';
import { createLabDeletionJob, type DeletionBatch } from '../../server/services/lab-deletion/lab-deletion-job.ts';
import { createLabDeletionService } from '../../server/services/lab-deletion/lab-deletion.service.ts';
import { createStripeClient } from '../../server/integrations/billing/create-stripe-client.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';

/**
 * Deleting a lab end to end: the app listens so the Stripe stand-in delivers its webhooks; the
 * lab to delete (A) is on a paid plan bought through the stand-in's checkout. The deletion job
 * is driven here directly (as main.ts would on its timer), once with a simulated crash midway
 * and once more to finish. Lab B is compared byte for byte, table by table, before and after
 * (as tests/api/lab-isolation.api.test.ts does); lab C takes readings while A's rows go.
 */
const plansFile = writeTestPlanCatalog();
const paidPlan = loadPlanCatalog(plansFile).plans.find((p) => p.priceLookupKey !== null)!;
let t: TestApp;
let A: LabWithEverything;
let B: LabWithEverything;
let C: LabWithEverything;
let cookieA: string;
let before: { b: string; aCounts: Record<string, number> };
const pathA = (p = '') => `/api/v1/labs/${A.lab.slug}${p}`;
const logger = createLogWriter({ silent: true });

beforeAll(async () => {
  t = await buildTestApp({ stripe: { ...testConfig().stripe, plansFile } });
  await t.listen();
  A = await buildLabWithEverything(t.db, { name: 'Mistaken pilot lab', rowInEveryTable: true });
  B = await buildLabWithEverything(t.db, { name: 'Neighbour lab', rowInEveryTable: true });
  C = await buildLabWithEverything(t.db, { name: 'Busy lab' });
  cookieA = await sessionCookieFor(t.db, t.config.sessionSecret, A.founder.id);
  // enough readings that every table's removal takes several batches of the job below
  const t0 = Date.UTC(2026, 2, 1);
  await t
    .db('readings')
    .insert(Array.from({ length: 37 }, (_, i) => ({ tenant_id: A.lab.id, channel_id: A.ids.channelId, ts: t0 + i * 60_000, value: i / 4 })));
});
afterAll(async () => t?.close());

async function snapshotOf(labId: number) {
  const tables = await Promise.all(LAB_OWNED_TABLES.map((name) => t.db(name).where({ tenant_id: labId }).orderByRaw('1, 2')));
  return JSON.stringify({ tables, lab: await t.db('labs').where({ id: labId }).first() });
}

async function rowCounts(labId: number): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const name of LAB_OWNED_TABLES) counts[name] = Number((await t.db(name).where({ tenant_id: labId }).count({ n: '*' }).first())?.n);
  return counts;
}

const billingOf = async (labId: number) => t.db('lab_billing').where({ tenant_id: labId }).first('status', 'stripe_subscription_id as subscription');
const requestDeletion = (confirmName: unknown, cookie = cookieA) => request(t.app).post(pathA('/deletion')).set('Cookie', cookie).send({ confirmName });

/** Buys the paid plan through the stand-in's checkout page, as a browser would. */
async function subscribe(lab = A, cookie = cookieA): Promise<void> {
  const started = await request(t.app)
    .post(`/api/v1/labs/${lab.lab.slug}/billing/checkout-session`)
    .set('Cookie', cookie)
    .send({ plan: paidPlan.key })
    .expect(201);
  const paid = await fetch(new URL(`${new URL(started.body.url).pathname}/pay`, started.body.url), { method: 'POST', redirect: 'manual' });
  expect(paid.status).toBe(303);
  await eventually(async () => (await billingOf(lab.lab.id))?.status === 'active');
}

/** Presses a button of the stand-in's billing portal for A's subscription. */
async function portal(action: 'fail-renewal' | 'pay-open'): Promise<void> {
  const session = await request(t.app).post(pathA('/billing/portal-session')).set('Cookie', cookieA).expect(201);
  const { subscription } = await billingOf(A.lab.id);
  const res = await fetch(`${session.body.url}/${action}`, { method: 'POST', body: new URLSearchParams({ subscription }), redirect: 'manual' });
  expect(res.status).toBe(303);
}

describe('deleting a lab', () => {
  it('refuses a confirmation that is not the lab’s name (400) and changes nothing', async () => {
    const snapshot = await snapshotOf(A.lab.id);
    for (const wrong of ['Mistaken pilot la', 'mistaken pilot lab', '']) {
      const res = await requestDeletion(wrong).expect(400);
      expect(res.body.error).toMatchObject({
        code: 'invalid_input',
        fields: [{ field: 'confirmName' }],
        message: 'The lab\'s name, to confirm: type the lab\'s name exactly as it is written ("Mistaken pilot lab") to confirm the deletion.',
      });
    }
    const missing = await request(t.app).post(pathA('/deletion')).set('Cookie', cookieA).send({}).expect(400);
    expect(missing.body.error.message).toBe("The lab's name, to confirm: type the lab's name to confirm.");
    expect(await snapshotOf(A.lab.id)).toBe(snapshot);
  });

  it('technicians, scientists and guests are refused (403) and the lab stays', async () => {
    for (const role of ['technician', 'scientist', 'guest'] as const) {
      const member = await buildMember(t.db, A.lab, { role });
      const res = await requestDeletion(A.lab.name, await sessionCookieFor(t.db, t.config.sessionSecret, member.id));
      expect(res.status, role).toBe(403);
      await t.db('memberships').where({ tenant_id: A.lab.id, user_id: member.id }).delete();
    }
    expect((await t.db('labs').where({ id: A.lab.id }).first()).deleted_at).toBeNull();
  });

  it('refuses while an invoice is unpaid (409, naming Billing): nothing is cancelled, closed or recorded', async () => {
    await subscribe();
    await portal('fail-renewal');
    await eventually(async () => (await billingOf(A.lab.id))?.status === 'past_due');
    const snapshot = await snapshotOf(A.lab.id);
    const res = await requestDeletion('Mistaken pilot lab').expect(409);
    expect(res.body.error.code).toBe('unpaid_invoice');
    expect(res.body.error.message).toContain('Pay the invoice, or cancel the subscription, under Billing');
    const stripe = createStripeClient(t.config.stripe);
    expect((await stripe.subscriptions.retrieve((await billingOf(A.lab.id)).subscription)).status).toBe('past_due');
    expect(await t.db('lab_deletions').where({ lab_id: A.lab.id })).toEqual([]);
    expect(await snapshotOf(A.lab.id)).toBe(snapshot);
    await portal('pay-open');
    await eventually(async () => (await billingOf(A.lab.id))?.status === 'active');
  });

  it('answers 503 when Stripe cannot be reached to cancel the subscription, and the lab stays open and untouched', async () => {
    const offline = await buildTestApp({ stripe: { ...testConfig().stripe, plansFile, apiBase: new URL('http://127.0.0.1:9') } });
    try {
      const f = await buildLabWithEverything(offline.db, { name: 'Paid lab offline', rowInEveryTable: true });
      await offline
        .db('lab_billing')
        .where({ tenant_id: f.lab.id })
        .update({ status: 'active', plan_key: paidPlan.key, stripe_subscription_id: 'sub_unreachable' });
      const cookie = await sessionCookieFor(offline.db, offline.config.sessionSecret, f.founder.id);
      const snapshot = await snapshotOf(f.lab.id);
      const res = await request(offline.app).post(`/api/v1/labs/${f.lab.slug}/deletion`).set('Cookie', cookie).send({ confirmName: 'Paid lab offline' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('billing_unavailable');
      expect(res.body.error.message).toContain('the lab was not deleted');
      expect(await snapshotOf(f.lab.id)).toBe(snapshot);
      expect(await offline.db('lab_deletions').where({ lab_id: f.lab.id })).toEqual([]);
      await request(offline.app).get(`/api/v1/labs/${f.lab.slug}`).set('Cookie', cookie).expect(200);
    } finally {
      await offline.close();
    }
  });

  it('the last admin may delete: the subscription is cancelled in the stand-in, the lab is closed at once, the deletion recorded outside the lab', async () => {
    // the founder is A's only admin: leaving is refused with a pointer to deleting instead
    const leave = await request(t.app).delete(pathA('/membership')).set('Cookie', cookieA).expect(409);
    expect(leave.body.error.message).toContain('delete the lab under Lab settings');
    // a pending invitation (its link, from the mail) and a logger key that work until the deletion
    const email = `pending-${Date.now()}@pilot.example`;
    await request(t.app).post(pathA('/invitations')).set('Cookie', cookieA).send({ email, role: 'scientist' }).expect(201);
    const mail = await waitForMail(process.env.LAGBOOK_MAIL_CAPTURE_URL!, (m) => m.to.includes(email));
    const link = /\/join\/([a-z0-9-]+)\/([A-Za-z0-9_-]+)/.exec(mail.text)!;
    const invitee = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildUser(t.db, { email })).id);
    await request(t.app).get(`/api/v1/invitations/${link[1]}/${link[2]}`).set('Cookie', invitee).expect(200);
    const subscription = (await billingOf(A.lab.id)).subscription as string;
    before = { b: await snapshotOf(B.lab.id), aCounts: await rowCounts(A.lab.id) };

    const res = await requestDeletion('  Mistaken pilot lab ').expect(202);
    expect(res.body.deletion).toMatchObject({ labSlug: A.lab.slug, labName: 'Mistaken pilot lab', subscriptionCancelled: true });

    const stripe = createStripeClient(t.config.stripe);
    expect((await stripe.subscriptions.retrieve(subscription)).status).toBe('canceled');
    // unreachable at once, for its members and through every way in
    expect((await request(t.app).get(pathA()).set('Cookie', cookieA)).status).toBe(404);
    expect((await request(t.app).get(pathA('/channels')).set('Cookie', cookieA)).status).toBe(404);
    expect((await request(t.app).get('/api/v1/me').set('Cookie', cookieA).expect(200)).body.labs).toEqual([]);
    expect((await request(t.app).get(`/api/v1/invitations/${link[1]}/${link[2]}`).set('Cookie', invitee)).status).toBe(404);
    expect((await request(t.app).post(`/api/v1/invitations/${link[1]}/${link[2]}/accept`).set('Cookie', invitee)).status).toBe(404);
    const posted = await request(t.app)
      .post('/api/v1/ingest')
      .set('Authorization', `Bearer ${A.ingestKey}`)
      .send({ readings: [{ channel: 'air_t', ts: '2026-03-02T00:00:00Z', value: 1 }] });
    expect(posted.status).toBe(401);
    expect((await request(t.app).get(`/api/v1/labs/${A.lab.slug}/channels`).set('Authorization', `Bearer ${A.personalToken}`)).status).toBe(404);
    // a second request finds no lab
    expect((await requestDeletion('Mistaken pilot lab')).status).toBe(404);

    const [record] = await t.db('lab_deletions').where({ lab_id: A.lab.id });
    expect(record).toMatchObject({
      lab_slug: A.lab.slug,
      lab_name: 'Mistaken pilot lab',
      requested_by_user_id: A.founder.id,
      requested_by_email: A.founder.email,
      stripe_subscription_id: subscription,
      finished_at: null,
    });
    expect(record.ready_at).toBeInstanceOf(Date);
    // the Stripe webhook for the cancellation finds no lab to change: A's rows are as they were
    await new Promise((r) => setTimeout(r, 500));
    expect(await rowCounts(A.lab.id)).toEqual(before.aCounts);
  });

  it('the job removes every row in bounded batches, resumes after a crash midway, and leaves other labs byte-for-byte unchanged and working', async () => {
    const beforeCrash: DeletionBatch[] = [];
    const crashing = createLabDeletionJob({
      db: t.db,
      logger,
      batchRows: 4,
      afterBatch: (b) => {
        beforeCrash.push(b);
        if (beforeCrash.length === 5) throw new Error('simulated crash');
      },
    });
    const first = await crashing.runOnce();
    expect(first.failed).toContain(A.lab.id);
    const midway = await rowCounts(A.lab.id);
    const total = (c: Record<string, number>) => Object.values(c).reduce((a, b) => a + b, 0);
    expect(total(midway)).toBeGreaterThan(0);
    // the five batches committed before the crash are gone (none more: the job stopped there), each at most 4 rows
    expect(beforeCrash.every((b) => b.labId === A.lab.id && b.removed <= 4)).toBe(true);
    expect(total(midway)).toBe(total(before.aCounts) - beforeCrash.reduce((n, b) => n + b.removed, 0));
    expect(midway.readings).toBeGreaterThan(0);
    expect((await t.db('labs').where({ id: A.lab.id }).first()).deleted_at).not.toBeNull();
    expect((await t.db('lab_deletions').where({ lab_id: A.lab.id }).first()).last_error).toContain('simulated crash');

    // the second run finishes; lab C ingests while A's rows go
    const seen: DeletionBatch[] = [];
    let cTs = Date.UTC(2026, 3, 1);
    const resumed = createLabDeletionJob({
      db: t.db,
      logger,
      batchRows: 4,
      afterBatch: async (b) => {
        seen.push(b);
        if (seen.length % 10 === 1) {
          const res = await request(t.app)
            .post('/api/v1/ingest')
            .set('Authorization', `Bearer ${C.ingestKey}`)
            .send({ readings: [{ channel: 'air_t', ts: (cTs += 60_000), value: 3.5 }] });
          expect(res.status).toBe(200);
        }
      },
    });
    const second = await resumed.runOnce();
    expect(second.finished).toContain(A.lab.id);
    expect(seen.every((b) => b.removed <= 4)).toBe(true);
    expect(new Set(seen.filter((b) => b.labId === A.lab.id && b.removed > 0).map((b) => b.table))).toEqual(
      new Set(
        Object.entries(midway)
          .filter(([, n]) => n > 0)
          .map(([table]) => table),
      ),
    );

    expect(await rowCounts(A.lab.id)).toEqual(Object.fromEntries(LAB_OWNED_TABLES.map((name) => [name, 0])));
    expect(await t.db('labs').where({ id: A.lab.id })).toEqual([]);
    expect(await snapshotOf(B.lab.id)).toBe(before.b);
    expect(Number((await t.db('readings').where({ tenant_id: C.lab.id }).count({ n: '*' }).first())?.n)).toBeGreaterThan(0);

    const [record] = await t.db('lab_deletions').where({ lab_id: A.lab.id });
    expect(record.finished_at).toBeInstanceOf(Date);
    expect(record.last_error).toBeNull();
    expect(JSON.parse(record.rows_removed)).toEqual(Object.fromEntries(Object.entries(before.aCounts).filter(([, n]) => n > 0)));
    // a third run has nothing to do
    expect(await resumed.runOnce()).toEqual({ finished: [], failed: [] });
  });

  it('a deletion whose request died while Stripe was asked is finished by the job after 15 minutes: subscription cancelled, rows removed', async () => {
    const D = await buildLabWithEverything(t.db, { name: 'Crashed request lab' });
    await subscribe(D, await sessionCookieFor(t.db, t.config.sessionSecret, D.founder.id));
    const subscription = (await billingOf(D.lab.id)).subscription as string;
    const fresh = await buildLabWithEverything(t.db, { name: 'Request still running' });
    // the state a request leaves when the process dies right after closing the lab: lab marked, record not ready
    const now = Date.now();
    for (const [lab, ageMs] of [
      [D, 20 * 60_000],
      [fresh, 60_000],
    ] as const) {
      await t
        .db('labs')
        .where({ id: lab.lab.id })
        .update({ deleted_at: new Date(now - ageMs) });
      await t.db('lab_deletions').insert({
        lab_id: lab.lab.id,
        lab_slug: lab.lab.slug,
        lab_name: lab.lab.name,
        requested_by_user_id: lab.founder.id,
        requested_by_name: 'Crash test',
        requested_by_email: lab.founder.email,
        requested_at: new Date(now - ageMs),
        rows_removed: '{}',
      });
    }
    const service = createLabDeletionService({ db: t.db, stripe: createStripeClient(t.config.stripe) });
    const job = createLabDeletionJob({ db: t.db, logger, beforeRun: service.settleStalled });
    const run = await job.runOnce();
    expect(run.finished).toContain(D.lab.id);
    expect(run.finished).not.toContain(fresh.lab.id);
    expect((await createStripeClient(t.config.stripe).subscriptions.retrieve(subscription)).status).toBe('canceled');
    expect(await t.db('labs').where({ id: D.lab.id })).toEqual([]);
    expect(await t.db('lab_deletions').where({ lab_id: D.lab.id }).first('stripe_subscription_id')).toEqual({ stripe_subscription_id: subscription });
    // the request that may still be talking to Stripe is left alone
    expect(await t.db('lab_deletions').where({ lab_id: fresh.lab.id }).first('ready_at')).toEqual({ ready_at: null });
    expect(await t.db('labs').where({ id: fresh.lab.id })).toHaveLength(1);
    await t.db('lab_deletions').where({ lab_id: fresh.lab.id }).delete();
  });

  it('removes children before the rows they reference: DELETION_ORDER against every foreign key between lab-owned tables', async () => {
    const [fks] = (await t.db.raw(
      `SELECT TABLE_NAME AS child, REFERENCED_TABLE_NAME AS parent FROM information_schema.REFERENTIAL_CONSTRAINTS WHERE CONSTRAINT_SCHEMA = DATABASE()`,
    )) as [Array<{ child: string; parent: string }>];
    const owned = new Set<string>(LAB_OWNED_TABLES);
    const between = fks.filter((fk) => owned.has(fk.child) && owned.has(fk.parent) && fk.child !== fk.parent);
    expect(between.length).toBeGreaterThan(0);
    const at = (name: string) => DELETION_ORDER.indexOf(name as (typeof DELETION_ORDER)[number]);
    for (const fk of between) expect(at(fk.child), `${fk.child} → ${fk.parent}`).toBeLessThan(at(fk.parent));
  });
});
