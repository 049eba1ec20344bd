import express, { type Router } from 'express';
import { resourceMissing } from './stripe-api-error.ts';
import { optionalMetadata, optionalString, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeId, unixNow } from './stripe-objects.ts';
import type { StandInState, StripeCustomer } from './stand-in-state.ts';

const WRITABLE = ['email', 'name', 'description', 'phone', 'metadata'] as const;
const ACCEPTED = [...WRITABLE, 'expand'];

function nullableField(params: StripeParams, name: (typeof WRITABLE)[number]): string | null | undefined {
  const value = optionalString(params, name);
  // Stripe clears a field sent as an empty string.
  return value === '' ? null : value;
}

/** Stripe merges metadata keys on update and deletes a key sent with an empty value. */
function mergeMetadata(current: Record<string, string>, update: Record<string, string>): Record<string, string> {
  const merged = { ...current, ...update };
  for (const [key, value] of Object.entries(update)) if (value === '') delete merged[key];
  return merged;
}

function applyFields(customer: StripeCustomer, params: StripeParams): void {
  for (const field of ['email', 'name', 'description', 'phone'] as const) {
    const value = nullableField(params, field);
    if (value !== undefined) customer[field] = value;
  }
  const metadata = optionalMetadata(params);
  if (metadata) customer.metadata = mergeMetadata(customer.metadata, metadata);
}

/**
 * Customers: create (`POST /v1/customers`), retrieve (`GET /v1/customers/:id`) and update
 * (`POST /v1/customers/:id`), following the Stripe API reference's Customer object.
 */
export function createCustomersRouter(state: StandInState): Router {
  const router = express.Router();

  function load(id: string): StripeCustomer {
    const customer = state.customers.get(id);
    if (!customer) throw resourceMissing('customer', id);
    return customer;
  }

  router.post('/', (req, res) => {
    const params: StripeParams = req.body ?? {};
    rejectUnknownParams(params, ACCEPTED);
    const customer: StripeCustomer = {
      id: stripeId('cus'),
      object: 'customer',
      created: unixNow(),
      livemode: false,
      email: null,
      name: null,
      description: null,
      phone: null,
      metadata: {},
      balance: 0,
      currency: null,
      delinquent: false,
      preferred_locales: [],
      invoice_settings: { default_payment_method: null },
    };
    applyFields(customer, params);
    state.customers.set(customer.id, customer);
    res.json(customer);
  });

  router.get('/:id', (req, res) => {
    res.json(load(req.params.id));
  });

  router.post('/:id', (req, res) => {
    const customer = load(req.params.id);
    const params: StripeParams = req.body ?? {};
    rejectUnknownParams(params, ACCEPTED);
    applyFields(customer, params);
    res.json(customer);
  });

  return router;
}
