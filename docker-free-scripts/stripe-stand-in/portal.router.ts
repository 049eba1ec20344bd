import express, { type Router } from 'express';
import { parameterInvalid, resourceMissing } from './stripe-api-error.ts';
import { optionalString, rejectUnknownParams, type StripeParams } from './request-params.ts';
import { stripeId, unixNow } from './stripe-objects.ts';
import type { StandInState, StripePortalSession } from './stand-in-state.ts';

/** Billing-portal sessions: create (`POST /v1/billing_portal/sessions`); `url` opens the stand-in's portal page. */
export function createPortalRouter(state: StandInState, baseUrl: () => string): Router {
  const router = express.Router();
  router.post('/', (req, res) => {
    const params: StripeParams = req.body ?? {};
    rejectUnknownParams(params, ['customer', 'return_url', 'expand']);
    const customer = optionalString(params, 'customer');
    if (!customer) throw parameterInvalid('customer', 'Missing required param: customer.');
    if (!state.customers.has(customer)) throw resourceMissing('customer', customer);
    const id = stripeId('bps');
    const session: StripePortalSession = {
      id,
      object: 'billing_portal.session',
      created: unixNow(),
      livemode: false,
      customer,
      return_url: optionalString(params, 'return_url') ?? null,
      url: `${baseUrl()}/portal/${id}`,
    };
    state.portalSessions.set(id, session);
    res.json(session);
  });
  return router;
}
