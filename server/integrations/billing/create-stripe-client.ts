import Stripe from 'stripe';
import type { Config } from '../../config.ts';

/**
 * The official Stripe SDK client. In development and tests `STRIPE_API_BASE` points it at
 * Lagbook's local stand-in (the SDK needs host, port and protocol given separately); in
 * production it is unset and the SDK talks to Stripe itself (config refuses the stand-in there).
 */
export function createStripeClient(stripe: Config['stripe']): Stripe {
  const base = stripe.apiBase;
  return new Stripe(stripe.secretKey, {
    maxNetworkRetries: 1,
    timeout: 10_000,
    ...(base
      ? {
          host: base.hostname,
          port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
          protocol: base.protocol.replace(':', '') as 'http' | 'https',
        }
      : {}),
  });
}
