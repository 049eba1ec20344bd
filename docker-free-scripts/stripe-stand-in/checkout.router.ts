import express, { type Router } from 'express';
import { parameterInvalid, resourceMissing } from './stripe-api-error.ts';
import { optionalMetadata, optionalString, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeId, unixNow } from './stripe-objects.ts';
import type { StandInState, StripeCheckoutSession } from './stand-in-state.ts';

const ACCEPTED = ['mode', 'customer', 'client_reference_id', 'line_items', 'metadata', 'subscription_data', 'success_url', 'cancel_url', 'expand'];

function required(params: StripeParams, name: string): string {
  const value = optionalString(params, name);
  if (!value) throw parameterInvalid(name, `Missing required param: ${name}.`);
  return value;
}

/** The one line item Lagbook sends: `line_items[0][price]`, quantity 1. */
function singlePrice(params: StripeParams): string {
  const items = params.line_items;
  const first = Array.isArray(items) ? items[0] : items && typeof items === 'object' ? Object.values(items)[0] : undefined;
  const price = (first as Record<string, unknown> | undefined)?.price;
  if (typeof price !== 'string') throw parameterInvalid('line_items', 'Missing required param: line_items[0][price].');
  return price;
}

/**
 * Checkout Sessions in subscription mode: create (`POST /v1/checkout/sessions`) and retrieve
 * (`GET /v1/checkout/sessions/:id`). The session's `url` opens the stand-in's own checkout page.
 */
export function createCheckoutRouter(state: StandInState, baseUrl: () => string): Router {
  const router = express.Router();

  router.post('/', (req, res) => {
    const params: StripeParams = req.body ?? {};
    rejectUnknownParams(params, ACCEPTED);
    if (required(params, 'mode') !== 'subscription') throw parameterInvalid('mode', 'The stand-in supports mode=subscription only.');
    const customer = required(params, 'customer');
    if (!state.customers.has(customer)) throw resourceMissing('customer', customer);
    const priceId = singlePrice(params);
    const price = state.prices.get(priceId);
    if (!price) throw resourceMissing('price', priceId);
    const subscriptionData = (params.subscription_data ?? {}) as StripeParams;
    const id = stripeId('cs_test');
    const session: StripeCheckoutSession = {
      id,
      object: 'checkout.session',
      created: unixNow(),
      livemode: false,
      mode: 'subscription',
      status: 'open',
      payment_status: 'unpaid',
      customer,
      client_reference_id: optionalString(params, 'client_reference_id') ?? null,
      metadata: optionalMetadata(params) ?? {},
      subscription: null,
      success_url: required(params, 'success_url'),
      cancel_url: optionalString(params, 'cancel_url') ?? null,
      url: `${baseUrl()}/checkout/${id}`,
      amount_total: price.unit_amount,
      currency: price.currency,
      line_price: price.id,
      subscription_metadata: optionalMetadata(subscriptionData) ?? {},
    };
    state.checkoutSessions.set(id, session);
    res.json(session);
  });

  router.get('/:id', (req, res) => {
    const session = state.checkoutSessions.get(req.params.id);
    if (!session) throw resourceMissing('checkout.session', req.params.id);
    res.json(session);
  });

  return router;
}
