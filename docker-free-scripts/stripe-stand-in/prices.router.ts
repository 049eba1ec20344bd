import express, { type Router } from 'express';
import { parameterInvalid } from './stripe-api-error.ts';
import { optionalString, optionalStringList, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeList } from './stripe-objects.ts';
import type { StandInState } from './stand-in-state.ts';

const DEFAULT_LIMIT = 10;
const MAX_LIMIT = 100;

function listLimit(params: StripeParams): number {
  const raw = optionalString(params, 'limit');
  if (raw === undefined) return DEFAULT_LIMIT;
  const limit = Number(raw);
  if (!Number.isInteger(limit) || limit < 1 || limit > MAX_LIMIT) {
    throw parameterInvalid('limit', `Invalid integer: limit must be between 1 and ${MAX_LIMIT}`);
  }
  return limit;
}

/**
 * Prices: list (`GET /v1/prices`) with the `lookup_keys[]`, `active` and `limit` filters, over
 * the prices configured at start. Stripe lists newest first, with a default page of 10.
 */
export function createPricesRouter(state: StandInState): Router {
  const router = express.Router();

  router.get('/', (req, res) => {
    const params = req.query as StripeParams;
    rejectUnknownParams(params, ['lookup_keys', 'active', 'limit', 'expand']);
    const lookupKeys = optionalStringList(params, 'lookup_keys');
    const active = optionalString(params, 'active');
    const limit = listLimit(params);
    const matching = [...state.prices.values()]
      .filter((price) => !lookupKeys || (price.lookup_key !== null && lookupKeys.includes(price.lookup_key)))
      .filter((price) => active === undefined || String(price.active) === active)
      .reverse();
    res.json(stripeList('/v1/prices', matching.slice(0, limit), matching.length > limit));
  });

  return router;
}
