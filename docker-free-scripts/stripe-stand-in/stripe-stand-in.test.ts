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
      const failure = await sdk(key).customers.create({}).catch((error: unknown) => error);
      expect(failure).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
      expect((failure as Stripe.errors.StripeError).statusCode).toBe(401);
    }
    const anonymous = await fetch(`${standIn.url}/v1/customers`, { method: 'POST' });
    expect(anonymous.status).toBe(401);
    expect(await anonymous.json()).toMatchObject({ error: { type: 'invalid_request_error' } });
  });
});
