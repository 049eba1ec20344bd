import express from 'express';
import { stripeEventBody, type StripeWebhookAnswer } from '../../contract/billing.ts';
import type { StripeWebhooks } from '../../services/billing/stripe-webhooks.service.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/** Where Stripe delivers events (configure this URL on the Stripe webhook endpoint). */
export const STRIPE_WEBHOOK_PATH = '/api/v1/billing/stripe-webhooks';

/**
 * `POST /api/v1/billing/stripe-webhooks`: Stripe's events, outside sessions and the lab guard
 * (mounted before the session middleware and the JSON parser). The body stays raw, since the
 * signature covers the exact bytes: `express.raw` reads it as the entry's `before` step, and the
 * route streams (it reads the raw body and the Stripe-Signature header itself). 200 once the event
 * is applied or known already; 400 for a bad signature (nothing changes); other failures answer
 * 5xx so Stripe delivers the event again.
 */
export function stripeWebhookRoutes(deps: { webhooks: StripeWebhooks }): Route[] {
  return [
    defineRoute({
      method: 'post',
      path: STRIPE_WEBHOOK_PATH,
      auth: 'webhook-signature',
      tag: 'billing',
      summary:
        "Stripe's webhook events (checkout, subscription and invoice changes); the Stripe-Signature header is verified against the raw body, 400 when it does not match.",
      bodyMediaTypes: { 'application/json': stripeEventBody },
      before: [express.raw({ type: 'application/json', limit: '512kb' })],
      response: {
        status: 200,
        description:
          '`{ received: true, outcome }`: the event was applied (`applied`), changed nothing (`unchanged`), was delivered before (`duplicate`) or names no lab here (`unknown-lab`).',
      },
      errors: {
        400: '`bad_signature`: the Stripe-Signature header does not match this endpoint’s secret over the raw body, or the event is too old; nothing changes (a body that is not application/json has nothing to verify and answers this too).',
        413: '`payload_too_large`: the body is over 512 KB.',
        500: 'Something went wrong on our side (`internal`); Stripe delivers the event again.',
        503: '`service_unavailable`: the database is unreachable, read-only or full; nothing was applied and Stripe delivers the event again.',
      },
      stream: true,
      handle: async (_input, { req, res }) => {
        const payload = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
        const outcome = await deps.webhooks.receive(payload, req.get('stripe-signature'));
        res.json({ received: true, outcome } satisfies StripeWebhookAnswer);
      },
    }),
  ];
}
