import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startStripeStandIn, type RunningStripeStandIn } from './stripe-stand-in.ts';

// Shapes and error semantics follow the Stripe API reference (sections "Errors", "Pagination",
// "Metadata", "Customers", "Prices"); the official SDK is the client, so its own parsing and
// error classes are the check.

const PRICES = [
  { lookupKey: 'greenhouse-monthly', productName: 'Greenhouse plan', unitAmount: 2900, currency: 'eur', interval: 'month' as const },
  { lookupKey: 'greenhouse-yearly', productName: 'Greenhouse plan', unitAmount: 29000, currency: 'eur', interval: 'year' as const },
  { lookupKey: 'canopy-monthly', productName: 'Canopy plan', unitAmount: 9900, currency: 'eur', interval: 'month' as const },
];

let standIn: RunningStripeStandIn;
let stripe: Stripe;

function sdk(key: string): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port: standIn.port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
}

beforeAll(async () => {
  standIn = await startStripeStandIn({ port: 0, prices: PRICES });
  stripe = sdk('sk_test_standin');
});

afterAll(async () => {
  await standIn?.close();
});

describe('Stripe stand-in', () => {
  it('answers its health check without a key', async () => {
    const response = await fetch(`${standIn.url}/healthz`);
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ ok: true });
  });

  it('creates, retrieves and updates a customer through the official SDK', async () => {
    const created = await stripe.customers.create({
      email: 'odalys.brennick@fernhollow.example',
      name: 'Fernhollow Field Station',
      metadata: { lab_id: 'lab-7', region: 'north' },
    });
    expect(created.object).toBe('customer');
    expect(created.id).toMatch(/^cus_[A-Za-z0-9]{24}$/);
    expect(created.livemode).toBe(false);
    expect(Math.abs(created.created - Date.now() / 1000)).toBeLessThan(60);
    expect(created.metadata).toEqual({ lab_id: 'lab-7', region: 'north' });

    const fetched = await stripe.customers.retrieve(created.id);
    expect(fetched).toMatchObject({ id: created.id, email: 'odalys.brennick@fernhollow.example', name: 'Fernhollow Field Station' });

    // Metadata keys merge on update and an empty value removes a key (Stripe API reference: Metadata).
    const updated = await stripe.customers.update(created.id, {
      email: 'billing@fernhollow.example',
      metadata: { region: '', plan: 'greenhouse' },
    });
    expect(updated.email).toBe('billing@fernhollow.example');
    expect(updated.name).toBe('Fernhollow Field Station');
    expect(updated.metadata).toEqual({ lab_id: 'lab-7', plan: 'greenhouse' });
    expect(await stripe.customers.retrieve(created.id)).toMatchObject({ email: 'billing@fernhollow.example' });
  });

  it('lists prices filtered by lookup key inside a list envelope', async () => {
    const list = await stripe.prices.list({ lookup_keys: ['greenhouse-yearly', 'canopy-monthly'] });
    expect(list.object).toBe('list');
    expect(list.has_more).toBe(false);
    expect(list.url).toBe('/v1/prices');
    expect(list.data.map((price) => price.lookup_key).sort()).toEqual(['canopy-monthly', 'greenhouse-yearly']);
    const yearly = list.data.find((price) => price.lookup_key === 'greenhouse-yearly')!;
    expect(yearly).toMatchObject({
      object: 'price',
      unit_amount: 29000,
      currency: 'eur',
      type: 'recurring',
      recurring: { interval: 'year', interval_count: 1 },
      livemode: false,
    });
    expect(yearly.id).toMatch(/^price_/);
    expect(yearly.product).toMatch(/^prod_/);

    const monthly = await stripe.prices.list({ lookup_keys: ['greenhouse-monthly'] });
    expect(monthly.data).toHaveLength(1);
    expect(monthly.data[0].product).toBe(yearly.product);

    const paged = await stripe.prices.list({ limit: 2 });
    expect(paged.data).toHaveLength(2);
    expect(paged.has_more).toBe(true);
  });

  it('answers a missing customer with resource_missing (Stripe API reference: Errors)', async () => {
    const failure = await stripe.customers.retrieve('cus_doesnotexist').catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    const error = failure as InstanceType<typeof Stripe.errors.StripeInvalidRequestError>;
    expect(error.statusCode).toBe(404);
    expect(error.code).toBe('resource_missing');
    expect(error.param).toBe('id');
    expect(error.message).toContain('cus_doesnotexist');
    expect(error.requestId).toMatch(/^req_/);
  });

  it('rejects a parameter the endpoint does not take', async () => {
    const failure = await stripe.customers
      .create({ email: 'x@fernhollow.example', colour: 'green' } as Stripe.CustomerCreateParams)
      .catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((failure as Stripe.errors.StripeError).code).toBe('parameter_unknown');
    expect((failure as Stripe.errors.StripeError).param).toBe('colour');
  });

  it('answers a live or malformed key with StripeAuthenticationError', async () => {
    for (const key of ['sk_live_realkey', 'not-a-key']) {
      const failure = await sdk(key)
        .customers.create({})
        .catch((error: unknown) => error);
      expect(failure).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
      expect((failure as Stripe.errors.StripeError).statusCode).toBe(401);
    }
    const anonymous = await fetch(`${standIn.url}/v1/customers`, { method: 'POST' });
    expect(anonymous.status).toBe(401);
    expect(await anonymous.json()).toMatchObject({ error: { type: 'invalid_request_error' } });
  });
});

describe('Stripe stand-in: checkout, portal, subscriptions, invoices and signed webhooks', () => {
  const SECRET = 'whsec_stand_in_unit_test';
  const received: Stripe.Event[] = [];
  let failNext = 1; // the first delivery is answered 500, to exercise the retry
  let receiver: Server;
  let receiverUrl: string;
  let billing: RunningStripeStandIn;
  let client: Stripe;

  beforeAll(async () => {
    receiver = createServer((req, res) => {
      const chunks: Buffer[] = [];
      req.on('data', (c: Buffer) => chunks.push(c));
      req.on('end', () => {
        if (failNext > 0) {
          failNext--;
          res.writeHead(500).end();
          return;
        }
        try {
          // the official SDK's verification is the check on signature and body
          received.push(client.webhooks.constructEvent(Buffer.concat(chunks), String(req.headers['stripe-signature']), SECRET));
          res.writeHead(200).end();
        } catch {
          res.writeHead(400).end();
        }
      });
    });
    await new Promise<void>((r) => receiver.listen(0, '127.0.0.1', r));
    receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/hook`;
    billing = await startStripeStandIn({ port: 0, prices: PRICES, webhook: { url: receiverUrl, secret: SECRET }, webhookBackoffMs: [0, 20, 20] });
    client = new Stripe('sk_test_standin', { host: '127.0.0.1', port: billing.port, protocol: 'http', maxNetworkRetries: 0 });
  });
  afterAll(async () => {
    await billing?.close();
    receiver?.closeAllConnections();
    await new Promise((r) => receiver?.close(r));
  });

  async function openCheckout() {
    const customer = await client.customers.create({ name: 'Fernhollow Field Station' });
    const [price] = (await client.prices.list({ lookup_keys: ['canopy-monthly'] })).data;
    const session = await client.checkout.sessions.create({
      mode: 'subscription',
      customer: customer.id,
      client_reference_id: 'lab-7',
      line_items: [{ price: price.id, quantity: 1 }],
      metadata: { plan_key: 'canopy' },
      subscription_data: { metadata: { plan_key: 'canopy' } },
      success_url: 'http://127.0.0.1:1/back?checkout=complete',
      cancel_url: 'http://127.0.0.1:1/back?checkout=cancelled',
    });
    return { customer, session };
  }

  it('creates a Checkout Session whose page sells the price, and paying sends signed events in order, retrying a failed delivery', async () => {
    const { customer, session } = await openCheckout();
    expect(session).toMatchObject({ object: 'checkout.session', status: 'open', payment_status: 'unpaid', customer: customer.id, amount_total: 9900 });
    expect(session.url).toBe(`${billing.url}/checkout/${session.id}`);
    const html = await (await fetch(session.url!)).text();
    expect(html).toContain('Subscribe to Canopy plan');
    expect(html).toContain('99.00 EUR');

    const declined = await fetch(`${session.url}/decline`, { method: 'POST' });
    expect(await declined.text()).toContain('The card was declined');
    expect((await client.checkout.sessions.retrieve(session.id)).status).toBe('open');

    const paid = await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe('http://127.0.0.1:1/back?checkout=complete');
    await billing.webhooks.idle();

    expect(received.map((e) => e.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    const attempts = billing.webhooks.deliveries();
    expect(attempts[0]).toMatchObject({ type: 'customer.subscription.created', attempt: 1, status: 500 });
    expect(attempts[1]).toMatchObject({ type: 'customer.subscription.created', attempt: 2, status: 200 });

    const completed = received[2].data.object as Stripe.Checkout.Session;
    expect(completed).toMatchObject({ status: 'complete', payment_status: 'paid', client_reference_id: 'lab-7', metadata: { plan_key: 'canopy' } });
    const sub = await client.subscriptions.retrieve(completed.subscription as string);
    expect(sub).toMatchObject({ status: 'active', customer: customer.id, metadata: { plan_key: 'canopy' } });
    expect(sub.items.data[0].price.lookup_key).toBe('canopy-monthly');
    const invoices = await client.invoices.list({ customer: customer.id });
    expect(invoices.data).toHaveLength(1);
    expect(invoices.data[0]).toMatchObject({ status: 'paid', amount_paid: 9900, currency: 'eur' });
    expect(invoices.data[0].parent?.subscription_details?.subscription).toBe(sub.id);
    expect((await fetch(invoices.data[0].hosted_invoice_url!)).status).toBe(200);
    // a completed session cannot be paid twice
    expect((await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' })).status).toBe(400);
  });

  it('runs the portal: a failed renewal makes the subscription past due, paying restores it, cancelling deletes it', async () => {
    received.length = 0;
    const { customer, session } = await openCheckout();
    await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    const sub = (await client.subscriptions.list({ customer: customer.id })).data[0];
    const portal = await client.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://127.0.0.1:1/back' });
    expect(portal.url).toBe(`${billing.url}/portal/${portal.id}`);
    expect(await (await fetch(portal.url)).text()).toContain('Make the next renewal fail');

    const press = (what: string) => fetch(`${portal.url}/${what}`, { method: 'POST', body: new URLSearchParams({ subscription: sub.id }), redirect: 'manual' });
    expect((await press('fail-renewal')).status).toBe(303);
    expect((await client.subscriptions.retrieve(sub.id)).status).toBe('past_due');
    expect((await press('pay-open')).status).toBe(303);
    expect((await client.subscriptions.retrieve(sub.id)).status).toBe('active');
    expect((await press('cancel')).status).toBe(303);
    expect((await client.subscriptions.retrieve(sub.id)).status).toBe('canceled');
    await billing.webhooks.idle();
    expect(received.map((e) => e.type).slice(3)).toEqual([
      'invoice.payment_failed',
      'customer.subscription.updated',
      'invoice.paid',
      'customer.subscription.updated',
      'customer.subscription.deleted',
    ]);
    // each event carries the object as it was then (a snapshot), not as it is now
    expect((received[4].data.object as Stripe.Subscription).status).toBe('past_due');
    expect((await client.invoices.list({ customer: customer.id })).data.map((i) => i.status)).toEqual(['paid', 'paid']);
  });

  it('moves a subscription to another price through the SDK and sends customer.subscription.updated', async () => {
    received.length = 0;
    const { customer, session } = await openCheckout();
    await fetch(`${session.url}/pay`, { method: 'POST', redirect: 'manual' });
    const sub = (await client.subscriptions.list({ customer: customer.id })).data[0];
    const [other] = (await client.prices.list({ lookup_keys: ['greenhouse-monthly'] })).data;
    const updated = await client.subscriptions.update(sub.id, {
      items: [{ id: sub.items.data[0].id, price: other.id }],
      proration_behavior: 'create_prorations',
      metadata: { plan_key: 'greenhouse' },
    });
    expect(updated.items.data[0].price.lookup_key).toBe('greenhouse-monthly');
    expect(updated.metadata).toMatchObject({ plan_key: 'greenhouse' });
    expect((await client.subscriptions.retrieve(sub.id)).items.data[0].price.id).toBe(other.id);
    await billing.webhooks.idle();
    const last = received[received.length - 1];
    expect(last.type).toBe('customer.subscription.updated');
    expect((last.data.object as Stripe.Subscription).items.data[0].price.lookup_key).toBe('greenhouse-monthly');
    // prorations go onto the next invoice: still only the first one
    expect((await client.invoices.list({ customer: customer.id })).data).toHaveLength(1);
    await expect(client.subscriptions.update(sub.id, { items: [{ id: 'si_missing', price: other.id }] })).rejects.toMatchObject({ code: 'resource_missing' });
    await client.subscriptions.cancel(sub.id);
    await expect(client.subscriptions.update(sub.id, { items: [{ id: sub.items.data[0].id, price: other.id }] })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
    });
  });

  it('refuses a checkout for an unknown price or customer the way Stripe does', async () => {
    const customer = await client.customers.create({});
    const failure = await client.checkout.sessions
      .create({ mode: 'subscription', customer: customer.id, line_items: [{ price: 'price_missing', quantity: 1 }], success_url: 'http://127.0.0.1:1/' })
      .catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((failure as Stripe.errors.StripeError).code).toBe('resource_missing');
    const noCustomer = await client.billingPortal.sessions.create({ customer: 'cus_missing' }).catch((e: unknown) => e);
    expect((noCustomer as Stripe.errors.StripeError).statusCode).toBe(404);
  });
});
