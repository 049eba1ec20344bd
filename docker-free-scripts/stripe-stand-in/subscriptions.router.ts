import express, { type Router } from 'express';
import { resourceMissing } from './stripe-api-error.ts';
import { optionalString, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeList } from './stripe-objects.ts';
import type { BillingActions } from './billing-actions.ts';
import type { StandInState } from './stand-in-state.ts';

/**
 * Subscriptions: retrieve, list by customer, cancel (`DELETE`, which sends
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
