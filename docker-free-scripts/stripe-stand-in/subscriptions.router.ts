import express, { type Router } from 'express';
import { parameterInvalid, resourceMissing } from './stripe-api-error.ts';
import { optionalMetadata, optionalString, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeList } from './stripe-objects.ts';
import type { BillingActions } from './billing-actions.ts';
import type { StandInState } from './stand-in-state.ts';

/**
 * Subscriptions: retrieve, list by customer, move the item to another price (`POST /:id`, which
 * sends `customer.subscription.updated`), cancel (`DELETE`, which sends
 * `customer.subscription.deleted`); and invoices: list by customer, newest first.
 */
export function createSubscriptionsRouter(state: StandInState, actions: BillingActions): Router {
  const router = express.Router();
  router.get('/', (req, res) => {
    const params = req.query as StripeParams;
    rejectUnknownParams(params, ['customer', 'status', 'limit', 'expand']);
    const customer = optionalString(params, 'customer');
    const list = [...state.subscriptions.values()].filter((s) => !customer || s.customer === customer).reverse();
    res.json(stripeList('/v1/subscriptions', list, false));
  });
  router.get('/:id', (req, res) => {
    const sub = state.subscriptions.get(req.params.id);
    if (!sub) throw resourceMissing('subscription', req.params.id);
    res.json(sub);
  });
  router.post('/:id', (req, res) => {
    const params: StripeParams = req.body ?? {};
    rejectUnknownParams(params, ['items', 'proration_behavior', 'metadata', 'expand']);
    const behaviour = optionalString(params, 'proration_behavior');
    if (behaviour !== undefined && behaviour !== 'create_prorations')
      throw parameterInvalid('proration_behavior', 'The stand-in supports proration_behavior=create_prorations only.');
    const items = params.items;
    const first = (Array.isArray(items) ? items[0] : items && typeof items === 'object' ? Object.values(items)[0] : undefined) as
      Record<string, unknown> | undefined;
    if (typeof first?.id !== 'string' || typeof first?.price !== 'string')
      throw parameterInvalid('items', 'The stand-in takes exactly items[0][id] and items[0][price].');
    res.json(actions.changePrice(req.params.id, first.id, first.price, optionalMetadata(params)));
  });
  router.delete('/:id', (req, res) => {
    res.json(actions.cancel(req.params.id));
  });
  return router;
}

/** Invoices: list (`GET /v1/invoices`) with the `customer` and `limit` filters, newest first. */
export function createInvoicesRouter(state: StandInState): Router {
  const router = express.Router();
  router.get('/', (req, res) => {
    const params = req.query as StripeParams;
    rejectUnknownParams(params, ['customer', 'subscription', 'limit', 'expand']);
    const customer = optionalString(params, 'customer');
    const limit = Number(optionalString(params, 'limit') ?? 10);
    const list = [...state.invoices.values()].filter((i) => !customer || i.customer === customer).reverse();
    res.json(stripeList('/v1/invoices', list.slice(0, limit), list.length > limit));
  });
  return router;
}
