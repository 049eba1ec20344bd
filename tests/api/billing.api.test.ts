import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { buildTestApp, testConfig, type TestApp } from '../support/test-app.ts';
import { sessionCookieFor } from '../support/factories.ts';
import { buildLabWithEverything, type LabWithEverything } from '../support/lab-fixture.ts';
import { eventually, signedEvent, TEST_LIMITS, writeTestPlanCatalog } from '../support/stripe-test-billing.ts';
import { waitForMail } from '../../docker-free-scripts/mail-capture/read-captured-mail.ts';
import { createUsageJob } from '../../server/services/billing/usage-job.ts';
import { loadPlanCatalog } from '../../server/services/billing/plan-catalog.ts';
import { createMailer } from '../../server/integrations/mail/create-mailer.ts';
import { createLogWriter } from '../../server/log-writer.ts';

/**
 * Plans, limits and Stripe end to end: the app listens on its configured port so the Stripe
 * stand-in (started by dev-services with the shipped catalog's prices) delivers its signed
 * webhooks to it; the app reads a catalog with the same lookup keys and tiny limits
 * (free: 10 readings, 2 loggers, 4 seats; first paid plan: 25 readings).
 */
const WEBHOOK = '/api/v1/billing/stripe-webhooks';
// Two days ago, on the hour: inside every test plan's history window whatever the date of the run.
const T0 = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 2 * 86_400_000;
const plansFile = writeTestPlanCatalog();
const catalog = loadPlanCatalog(plansFile);
const paidPlan = catalog.plans.find((p) => p.priceLookupKey !== null)!;
let t: TestApp;

beforeAll(async () => {
  const base = testConfig();
  t = await buildTestApp({ stripe: { ...base.stripe, plansFile } });
  await t.listen();
});
afterAll(async () => t?.close());

interface Lab {
  f: LabWithEverything;
  cookie: string;
  path: (p?: string) => string;
}

async function newLab(): Promise<Lab> {
  const f = await buildLabWithEverything(t.db);
  const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, f.founder.id);
  return { f, cookie, path: (p = '') => `/api/v1/labs/${f.lab.slug}${p}` };
}

/** Posts `n` readings starting at reading number `from` (one second apart) with the lab's logger key. */
function ingest(lab: Lab, from: number, n: number) {
  const readings = Array.from({ length: n }, (_, i) => ({ channel: 'air_t', ts: T0 + (from + i) * 1000, value: from + i }));
  return request(t.app).post('/api/v1/ingest').set('Authorization', `Bearer ${lab.f.ingestKey}`).send({ readings });
}

const storedReadings = async (lab: Lab) => Number((await t.db('readings').where('tenant_id', lab.f.lab.id).count({ n: '*' }).first())?.n);
const counter = async (lab: Lab) => Number((await t.db('lab_billing').where('tenant_id', lab.f.lab.id).first('readings_count'))?.readings_count ?? 0);
/** Waits until the after-commit counter bump has landed. */
const counterReaches = (lab: Lab, n: number) => eventually(async () => (await counter(lab)) === n);
const overview = async (lab: Lab) => (await request(t.app).get(lab.path('/billing')).set('Cookie', lab.cookie).expect(200)).body;

/** Starts checkout through the API and pays on the stand-in's page (as the browser would). */
async function upgrade(lab: Lab, plan = paidPlan.key): Promise<void> {
  const started = await request(t.app).post(lab.path('/billing/checkout-session')).set('Cookie', lab.cookie).send({ plan }).expect(201);
  const paid = await fetch(new URL(`${new URL(started.body.url).pathname}/pay`, started.body.url), { method: 'POST', redirect: 'manual' });
  expect(paid.status).toBe(303);
  expect(paid.headers.get('location')).toBe(`${t.config.publicUrl}/labs/${lab.f.lab.slug}/billing?checkout=complete`);
  await eventually(async () => (await overview(lab)).plan.key === plan);
}

/** Opens the portal through the API and presses one of its buttons for the lab's subscription. */
async function portalAction(lab: Lab, action: 'cancel' | 'fail-renewal' | 'pay-open'): Promise<void> {
  const portal = await request(t.app).post(lab.path('/billing/portal-session')).set('Cookie', lab.cookie).expect(201);
  const subscription = (await t.db('lab_billing').where('tenant_id', lab.f.lab.id).first('stripe_subscription_id')).stripe_subscription_id as string;
  const res = await fetch(`${portal.body.url}/${action}`, { method: 'POST', body: new URLSearchParams({ subscription }), redirect: 'manual' });
  expect(res.status).toBe(303);
}

describe('plan limit at ingestion (free plan: 10 stored readings)', () => {
  it('accepts a batch that ends exactly at the limit and refuses one more with 402, Retry-After and nothing written', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 6)).status).toBe(200);
    await counterReaches(lab, 6);
    const atLimit = await ingest(lab, 6, 4);
    expect(atLimit.status).toBe(200);
    expect(atLimit.body.accepted).toBe(4);
    await counterReaches(lab, 10);

    const over = await ingest(lab, 10, 1);
    expect(over.status).toBe(402);
    expect(over.headers['retry-after']).toBe('3600');
    expect(over.body.error.code).toBe('plan_limit_reached');
    expect(over.body.error.message).toContain('allows 10 stored readings; 10 are in use and this would add 1');
    expect(await storedReadings(lab)).toBe(10);
    expect(await counter(lab)).toBe(10);

    // re-sending stored rows adds nothing, so it is still accepted (as duplicates) at the limit
    const resent = await ingest(lab, 0, 10);
    expect(resent.status).toBe(200);
    expect(resent.body).toMatchObject({ accepted: 0, duplicates: 10 });
    // stored data stays readable
    const series = await request(t.app)
      .get(lab.path(`/channels/${lab.f.ids.channelId}/series`))
      .set('Cookie', lab.cookie);
    expect(series.status).toBe(200);
  });

  it('refuses a batch straddling the limit as a whole (8 stored + 5 new): not one of the 5 is written', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 8)).status).toBe(200);
    await counterReaches(lab, 8);
    const straddling = await ingest(lab, 8, 5);
    expect(straddling.status).toBe(402);
    expect(await storedReadings(lab)).toBe(8);
    expect(await t.db('quarantined_rows').where('tenant_id', lab.f.lab.id).count({ n: '*' }).first()).toMatchObject({ n: 1 }); // the fixture's own row only
    // duplicates inside a straddling batch do not count: 3 stored + 2 new reaches exactly 10
    const mixed = await ingest(lab, 5, 5);
    expect(mixed.status).toBe(200);
    expect(mixed.body).toMatchObject({ accepted: 2, duplicates: 3 });
  });
});

describe('logger and member limits', () => {
  it('refuses the logger past the plan (free: 2) and the invitation past the seats (free: 4) with 402', async () => {
    const lab = await newLab();
    const body = (n: number) => ({ name: `Station ${n}`, timezone: 'UTC', expectedIntervalS: 60, channels: [{ key: 'rh', label: 'Humidity', unit: '%' }] });
    expect((await request(t.app).post(lab.path('/loggers')).set('Cookie', lab.cookie).send(body(2))).status).toBe(201);
    const third = await request(t.app).post(lab.path('/loggers')).set('Cookie', lab.cookie).send(body(3));
    expect(third.status).toBe(402);
    expect(third.body.error.code).toBe('plan_limit_reached');
    expect(third.headers['retry-after']).toBe('3600');
    expect((await t.db('loggers').where('tenant_id', lab.f.lab.id).count({ n: '*' }).first())?.n).toBe(2);

    // fixture: founder, guest and one pending invitation = 3 seats of 4
    expect(
      (
        await request(t.app)
          .post(lab.path('/invitations'))
          .set('Cookie', lab.cookie)
          .send({ email: `a-${Date.now()}@lab.example`, role: 'guest' })
      ).status,
    ).toBe(201);
    const fifth = await request(t.app)
      .post(lab.path('/invitations'))
      .set('Cookie', lab.cookie)
      .send({ email: `b-${Date.now()}@lab.example`, role: 'guest' });
    expect(fifth.status).toBe(402);
    expect(fifth.body.error.message).toContain('allows 4 members');
  });
});

describe('upgrade through Stripe Checkout (stand-in) and back', () => {
  it('keeps the plan until the verified webhook lands, then raises the limits; audit, invoices and ingestion follow', async () => {
    const lab = await newLab();
    const before = await overview(lab);
    expect(before).toMatchObject({ plan: { key: catalog.free.key }, status: 'none', limits: TEST_LIMITS.free });
    expect(before.plans.map((p: { key: string }) => p.key)).toEqual(catalog.plans.map((p) => p.key));

    const started = await request(t.app).post(lab.path('/billing/checkout-session')).set('Cookie', lab.cookie).send({ plan: paidPlan.key }).expect(201);
    expect(started.body.url).toMatch(new RegExp(`^${process.env.STRIPE_API_BASE}/checkout/cs_test_`));
    // checkout started, nothing paid: the plan has not moved
    expect((await overview(lab)).plan.key).toBe(catalog.free.key);
    const page = await fetch(started.body.url);
    expect(await page.text()).toContain('Pay with the test card');

    await fetch(`${started.body.url}/pay`, { method: 'POST', redirect: 'manual' });
    const after = await eventually(async () => {
      const o = await overview(lab);
      return o.plan.key === paidPlan.key && o;
    });
    expect(after).toMatchObject({ status: 'active', limits: TEST_LIMITS.paid, graceUntil: null });

    const audit = await request(t.app).get(lab.path('/audit')).set('Cookie', lab.cookie).expect(200);
    const actions = audit.body.entries.map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['billing.checkout-started', 'billing.plan-changed', 'billing.status-changed']));
    expect(actions.filter((a: string) => a === 'billing.plan-changed')).toHaveLength(1);
    // people read our own sentences; the payment service's event names stay in the recorded summary
    const changed = audit.body.entries.find((e: { action: string }) => e.action === 'billing.plan-changed');
    expect(changed.sentence).toMatch(new RegExp(`^Plan changed from .+ to ${paidPlan.name} (after payment|after checkout|as the subscription changed)\\.$`));
    for (const e of audit.body.entries as Array<{ sentence: string }>) expect(e.sentence).not.toMatch(/Stripe|invoice\.|customer\.|checkout\.session|past_due/);

    const invoices = await request(t.app).get(lab.path('/billing/invoices')).set('Cookie', lab.cookie).expect(200);
    expect(invoices.body.invoices).toHaveLength(1);
    expect(invoices.body.invoices[0]).toMatchObject({ status: 'paid', amountPaid: paidPlan.monthlyAmount, currency: catalog.currency });
    expect((await fetch(invoices.body.invoices[0].hostedUrl)).status).toBe(200);

    // 20 readings now fit (free would stop at 10)
    expect((await ingest(lab, 0, 20)).status).toBe(200);
    await counterReaches(lab, 20);
    // a second checkout while subscribed is refused: changes go through the portal
    const again = await request(t.app).post(lab.path('/billing/checkout-session')).set('Cookie', lab.cookie).send({ plan: paidPlan.key });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('subscription_exists');
  });

  it('cancellation returns the lab to the free plan without deleting data; ingestion is refused until it upgrades again', async () => {
    const lab = await newLab();
    await upgrade(lab);
    expect((await ingest(lab, 0, 20)).status).toBe(200);
    await counterReaches(lab, 20);

    await portalAction(lab, 'cancel');
    const cancelled = await eventually(async () => {
      const o = await overview(lab);
      return o.status === 'canceled' && o;
    });
    expect(cancelled).toMatchObject({ plan: { key: catalog.free.key }, ingestionRefused: true, usage: { readings: 20 } });
    expect(await storedReadings(lab)).toBe(20);
    const range = `?from=${T0}&to=${T0 + 3600_000}`;
    const csv = await request(t.app)
      .get(lab.path(`/channels/${lab.f.ids.channelId}/readings.csv${range}`))
      .set('Cookie', lab.cookie);
    expect(csv.status).toBe(200);
    expect(csv.text.trim().split('\n')).toHaveLength(21); // header + the 20 readings
    expect((await ingest(lab, 20, 1)).status).toBe(402);

    await upgrade(lab);
    expect((await ingest(lab, 20, 1)).status).toBe(200);
  });

  it('a failed renewal keeps the plan through the grace period (mail to admins), paying ends it', async () => {
    const lab = await newLab();
    await upgrade(lab);
    const failedAt = Date.now();
    await portalAction(lab, 'fail-renewal');
    const pastDue = await eventually(async () => {
      const o = await overview(lab);
      return o.status === 'past_due' && o;
    });
    expect(pastDue.plan.key).toBe(paidPlan.key);
    const graceMs = Date.parse(pastDue.graceUntil) - failedAt;
    expect(Math.abs(graceMs - t.config.stripe.graceDays * 86_400_000)).toBeLessThan(10_000);
    const mail = await waitForMail(process.env.LAGBOOK_MAIL_CAPTURE_URL!, (m) => m.to.includes(lab.f.founder.email) && m.subject.includes('payment failed'));
    expect(mail.text).toContain(`/labs/${lab.f.lab.slug}/billing`);

    await portalAction(lab, 'pay-open');
    const paid = await eventually(async () => {
      const o = await overview(lab);
      return o.status === 'active' && o;
    });
    expect(paid.graceUntil).toBeNull();
  });

  it('answers 503 billing_unavailable when Stripe cannot be reached, and the plan stays as it was', async () => {
    const base = testConfig();
    const offline = await buildTestApp({ stripe: { ...base.stripe, plansFile, apiBase: new URL('http://127.0.0.1:9') } });
    try {
      const f = await buildLabWithEverything(offline.db);
      const cookie = await sessionCookieFor(offline.db, offline.config.sessionSecret, f.founder.id);
      const res = await request(offline.app).post(`/api/v1/labs/${f.lab.slug}/billing/checkout-session`).set('Cookie', cookie).send({ plan: paidPlan.key });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('billing_unavailable');
      expect(res.headers['retry-after']).toBe('30');
      const row = await offline.db('lab_billing').where('tenant_id', f.lab.id).first();
      expect(row).toMatchObject({ plan_key: catalog.free.key, status: 'none', stripe_subscription_id: null });
    } finally {
      await offline.close();
    }
  });
});

describe('switching between paid plans (stand-in)', () => {
  const bigPlan = catalog.plans.filter((p) => p.priceLookupKey !== null)[1];
  const switchTo = (lab: Lab, plan: string, acknowledgeLimits?: boolean) =>
    request(t.app)
      .post(lab.path('/billing/plan-change'))
      .set('Cookie', lab.cookie)
      .send(acknowledgeLimits === undefined ? { plan } : { plan, acknowledgeLimits });

  it('moves the subscription to a larger plan once Stripe confirms, and back to a smaller one only when told the lab is over its limits', async () => {
    const lab = await newLab();
    await upgrade(lab);
    const up = await switchTo(lab, bigPlan.key);
    expect(up.status).toBe(202);
    expect(up.body).toMatchObject({ plan: bigPlan.key });
    expect(up.body.message).toContain('prorated');
    const bigger = await eventually(async () => {
      const o = await overview(lab);
      return o.plan.key === bigPlan.key && o;
    });
    expect(bigger).toMatchObject({ status: 'active', limits: { readings: 1000 } });
    // 30 readings: more than the first paid plan's 25
    expect((await ingest(lab, 0, 30)).status).toBe(200);
    await counterReaches(lab, 30);

    const refused = await switchTo(lab, paidPlan.key);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('plan_too_small');
    expect(refused.body.error.message).toContain('allows 25 stored readings and the lab has 30');
    expect((await overview(lab)).plan.key).toBe(bigPlan.key);

    expect((await switchTo(lab, paidPlan.key, true)).status).toBe(202);
    const smaller = await eventually(async () => {
      const o = await overview(lab);
      return o.plan.key === paidPlan.key && o;
    });
    expect(smaller).toMatchObject({ ingestionRefused: true, usage: { readings: 30 } });
    expect(await storedReadings(lab)).toBe(30);
    expect((await ingest(lab, 30, 1)).status).toBe(402);

    const audit = await request(t.app).get(lab.path('/audit')).set('Cookie', lab.cookie).expect(200);
    const actions = audit.body.entries.map((e: { action: string }) => e.action);
    expect(actions.filter((a: string) => a === 'billing.plan-change-requested')).toHaveLength(2);
    expect(actions.filter((a: string) => a === 'billing.plan-changed')).toHaveLength(3); // checkout, up, down
  });

  it('refuses a switch without a subscription, to the plan already paid for, and to the free plan', async () => {
    const lab = await newLab();
    const none = await switchTo(lab, bigPlan.key);
    expect(none.status).toBe(409);
    expect(none.body.error.code).toBe('no_subscription');
    await upgrade(lab);
    const same = await switchTo(lab, paidPlan.key);
    expect(same.status).toBe(409);
    expect(same.body.error.code).toBe('same_plan');
    const free = await switchTo(lab, catalog.free.key);
    expect(free.status).toBe(400);
    expect(free.body.error.message).toContain('cancel the subscription');
    expect((await switchTo(lab, 'no-such-plan')).status).toBe(400);
    expect((await overview(lab)).plan.key).toBe(paidPlan.key);
  });
});

describe('webhook endpoint', () => {
  const secret = () => t.config.stripe.webhookSecret;
  const send = (e: { body: string; signature: string }) =>
    request(t.app).post(WEBHOOK).set('Content-Type', 'application/json').set('Stripe-Signature', e.signature).send(e.body);
  let n = 0;
  const subscriptionEvent = (lab: Lab, over: { created: number; status: string; type?: string; id?: string }) =>
    signedEvent(secret(), {
      id: over.id ?? `evt_test_${Date.now()}_${n++}`,
      type: over.type ?? 'customer.subscription.updated',
      created: over.created,
      object: {
        id: `sub_for_${lab.f.lab.id}`,
        object: 'subscription',
        customer: `cus_for_${lab.f.lab.id}`,
        status: over.status,
        metadata: { lab_id: String(lab.f.lab.id) },
        items: { object: 'list', data: [{ id: 'si_1', price: { id: 'price_1', lookup_key: paidPlan.priceLookupKey } }] },
      },
    });
  const row = (lab: Lab) => t.db('lab_billing').where('tenant_id', lab.f.lab.id).first();

  it('refuses a bad or missing signature with 400 and changes nothing', async () => {
    const lab = await newLab();
    const good = subscriptionEvent(lab, { created: 1_800_000_000, status: 'active' });
    const wrongSecret = signedEvent('whsec_not_the_endpoint_secret', {
      id: 'evt_forged',
      type: 'customer.subscription.updated',
      created: 1_800_000_000,
      object: JSON.parse(good.body).data.object,
    });
    for (const attempt of [wrongSecret, { body: good.body, signature: '' }, { body: good.body.replace('active', 'past_due'), signature: good.signature }]) {
      const res = await send(attempt);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('bad_signature');
    }
    expect(await row(lab)).toBeUndefined();
    expect(await t.db('stripe_events').where('id', 'evt_forged').first()).toBeUndefined();
  });

  it('applies a replayed event once (idempotent by event id)', async () => {
    const lab = await newLab();
    const event = subscriptionEvent(lab, { created: 1_800_000_000, status: 'active' });
    expect((await send(event)).body.outcome).toBe('applied');
    expect((await send(event)).body.outcome).toBe('duplicate');
    expect(await row(lab)).toMatchObject({ plan_key: paidPlan.key, status: 'active' });
    const audits = await t.db('audit_events').where({ tenant_id: lab.f.lab.id, action: 'billing.plan-changed' }).count({ n: '*' }).first();
    expect(Number(audits?.n)).toBe(1);
  });

  it('never rolls state back for an older event arriving after a newer one', async () => {
    const lab = await newLab();
    expect((await send(subscriptionEvent(lab, { created: 1_800_000_200, status: 'past_due' }))).body.outcome).toBe('applied');
    const graceUntil = (await row(lab)).grace_until as Date;
    expect(graceUntil.getTime()).toBe((1_800_000_200 + t.config.stripe.graceDays * 86400) * 1000);
    // older "active" arrives late: ignored for state
    expect((await send(subscriptionEvent(lab, { created: 1_800_000_100, status: 'active' }))).body.outcome).toBe('unchanged');
    expect(await row(lab)).toMatchObject({ status: 'past_due', state_at: 1_800_000_200 });
    // a newer deletion applies: back to the free plan
    expect((await send(subscriptionEvent(lab, { created: 1_800_000_300, status: 'canceled', type: 'customer.subscription.deleted' }))).body.outcome).toBe(
      'applied',
    );
    expect(await row(lab)).toMatchObject({ plan_key: catalog.free.key, status: 'canceled', stripe_subscription_id: null, grace_until: null });
  });

  it('takes subscription.updated before checkout.session.completed, and the late checkout event changes nothing', async () => {
    const lab = await newLab();
    await send(subscriptionEvent(lab, { created: 1_800_000_500, status: 'active' }));
    const checkout = signedEvent(secret(), {
      id: `evt_checkout_${Date.now()}`,
      type: 'checkout.session.completed',
      created: 1_800_000_400,
      object: {
        id: 'cs_test_1',
        object: 'checkout.session',
        mode: 'subscription',
        payment_status: 'paid',
        customer: `cus_for_${lab.f.lab.id}`,
        subscription: `sub_for_${lab.f.lab.id}`,
        client_reference_id: String(lab.f.lab.id),
        metadata: { plan_key: paidPlan.key, lab_id: String(lab.f.lab.id) },
      },
    });
    const res = await send(checkout);
    expect(res.status).toBe(200);
    expect(await row(lab)).toMatchObject({
      plan_key: paidPlan.key,
      status: 'active',
      stripe_subscription_id: `sub_for_${lab.f.lab.id}`,
      state_at: 1_800_000_500,
    });
  });

  it('acknowledges an event for a customer it does not know (200) without touching any lab', async () => {
    const event = signedEvent(secret(), {
      id: `evt_unknown_${Date.now()}`,
      type: 'invoice.paid',
      created: 1_800_000_000,
      object: { id: 'in_1', object: 'invoice', customer: 'cus_nobody' },
    });
    const res = await send(event);
    expect(res.status).toBe(200);
    expect(res.body.outcome).toBe('unknown-lab');
  });
});

describe('usage counter in the batch transaction', () => {
  it('counts a batch before its 200 answers (no write left for shutdown), and a refused batch counts nothing', async () => {
    const lab = await newLab();
    expect((await ingest(lab, 0, 7)).status).toBe(200);
    expect(await counter(lab)).toBe(7); // read at once, no waiting for a later write
    expect((await ingest(lab, 7, 4)).status).toBe(402);
    expect(await counter(lab)).toBe(7);
    expect(await storedReadings(lab)).toBe(7);
  });
});

describe('usage job (simulated clock)', () => {
  it('reconciles the counter exactly, writes a daily snapshot, and mails admins once per crossing of 80% and 100%', async () => {
    const lab = await newLab();
    const mailer = createMailer(t.config.smtp);
    let clock = new Date('2026-12-01T06:00:00Z');
    const job = createUsageJob({ db: t.db, catalog, mailer, logger: createLogWriter({ silent: true }), publicUrl: t.config.publicUrl, now: () => clock });
    const labRow = { id: lab.f.lab.id, slug: lab.f.lab.slug, name: lab.f.lab.name };
    try {
      expect((await ingest(lab, 0, 8)).status).toBe(200);
      await counterReaches(lab, 8);
      // a lost counter bump is repaired from the channels' counters
      await t.db('lab_billing').where('tenant_id', lab.f.lab.id).update({ readings_count: 3 });
      await job.reconcileLab(labRow);
      expect(await counter(lab)).toBe(8);
      const warned = (await row()).warned_percent;
      expect(warned).toBe(80);
      await waitForMail(process.env.LAGBOOK_MAIL_CAPTURE_URL!, (m) => m.to.includes(lab.f.founder.email) && m.subject.includes('80%'));

      clock = new Date('2026-12-02T06:00:00Z');
      await job.reconcileLab(labRow); // same level: no second mail
      expect((await ingest(lab, 8, 2)).status).toBe(200);
      await counterReaches(lab, 10);
      clock = new Date('2026-12-03T06:00:00Z');
      await job.reconcileLab(labRow);
      await waitForMail(process.env.LAGBOOK_MAIL_CAPTURE_URL!, (m) => m.to.includes(lab.f.founder.email) && m.subject.includes('storage full'));
      await job.reconcileLab(labRow);

      const res = await fetch(`${process.env.LAGBOOK_MAIL_CAPTURE_URL}/messages?to=${encodeURIComponent(lab.f.founder.email)}`);
      const mails = ((await res.json()) as Array<{ subject: string }>).map((m) => m.subject);
      expect(mails.filter((s) => s.includes('80%'))).toHaveLength(1);
      expect(mails.filter((s) => s.includes('storage full'))).toHaveLength(1);

      const snapshots = await t.db('usage_snapshots').where('tenant_id', lab.f.lab.id).orderBy('day');
      expect(snapshots.map((s: { readings: number }) => Number(s.readings))).toEqual([8, 8, 10]);
      const trend = (await overview(lab)).trend;
      expect(trend.map((d: { day: string }) => d.day)).toEqual(['2026-12-01', '2026-12-02', '2026-12-03']);
    } finally {
      mailer.close();
    }

    async function row() {
      return t.db('lab_billing').where('tenant_id', lab.f.lab.id).first();
    }
  });
});
