import express, { Router } from 'express';
import type { StripeWebhooks } from '../../services/billing/stripe-webhooks.service.ts';

/** Where Stripe delivers events (configure this URL on the Stripe webhook endpoint). */
export const STRIPE_WEBHOOK_PATH = '/api/v1/billing/stripe-webhooks';

/**
 * `POST /api/v1/billing/stripe-webhooks`: Stripe's events, outside sessions and the lab guard.
 * The body stays raw (the signature covers the exact bytes). 200 once the event is applied or
 * known already; 400 for a bad signature (nothing changes); other failures answer 5xx so
 * Stripe delivers the event again.
 */
export function stripeWebhooksRouter(deps: { webhooks: StripeWebhooks }): Router {
  const router = Router();
  router.post(STRIPE_WEBHOOK_PATH, express.raw({ type: 'application/json', limit: '512kb' }), async (req, res) => {
    const payload = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    const outcome = await deps.webhooks.receive(payload, req.get('stripe-signature'));
    res.json({ received: true, outcome });
  });
  return router;
}
