import Stripe from 'stripe';
import { stripeId, unixNow } from './stripe-objects.ts';

/** Where and how the stand-in delivers events (Stripe dashboard: the webhook endpoint and its secret). */
export interface WebhookTarget {
  url: string;
  /** `whsec_…`, the same value the app reads from STRIPE_WEBHOOK_SECRET. */
  secret: string;
}

/** One delivery attempt's result, kept for tests and the log. */
export interface WebhookDelivery {
  eventId: string;
  type: string;
  attempt: number;
  status: number | 'network-error';
}

/** A Stripe Event envelope. */
export interface StripeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  livemode: false;
  pending_webhooks: number;
  request: { id: null; idempotency_key: null };
  type: string;
  data: { object: unknown };
}

/** Waits between attempts (ms); Stripe itself retries for days with growing gaps. */
const DEFAULT_BACKOFF_MS = [0, 300, 1000, 3000, 8000];

// Only the SDK's webhook helpers are used; this key never leaves the process.
const signer = new Stripe('sk_test_stand_in_signer');

/**
 * Delivers events to the app like Stripe does: a JSON body signed with the endpoint secret
 * (`Stripe-Signature`, made by the SDK's `generateTestHeaderString`), out of band of the
 * request that caused them, one after another in the order they happened, each retried
 * with back-off until the app answers 2xx or the attempts run out.
 */
export function createWebhookSender(target: WebhookTarget | undefined, opts: { backoffMs?: number[] } = {}) {
  const backoff = opts.backoffMs ?? DEFAULT_BACKOFF_MS;
  const deliveries: WebhookDelivery[] = [];
  let queue: Promise<void> = Promise.resolve();

  async function deliver(event: StripeEvent): Promise<void> {
    if (!target) return;
    const payload = JSON.stringify(event);
    for (let attempt = 1; attempt <= backoff.length; attempt++) {
      await new Promise((r) => setTimeout(r, backoff[attempt - 1]));
      const header = signer.webhooks.generateTestHeaderString({ payload, secret: target.secret });
      let status: WebhookDelivery['status'];
      try {
        const res = await fetch(target.url, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'Stripe-Signature': header },
          body: payload,
          signal: AbortSignal.timeout(10_000),
        });
        await res.arrayBuffer();
        status = res.status;
      } catch {
        status = 'network-error';
      }
      deliveries.push({ eventId: event.id, type: event.type, attempt, status });
      if (typeof status === 'number' && status >= 200 && status < 300) return;
    }
  }

  return {
    /** Builds an event around `object` and queues its delivery; returns the event at once. */
    emit(type: string, object: unknown): StripeEvent {
      const event: StripeEvent = {
        id: stripeId('evt'),
        object: 'event',
        api_version: Stripe.API_VERSION,
        created: unixNow(),
        livemode: false,
        pending_webhooks: target ? 1 : 0,
        request: { id: null, idempotency_key: null },
        type,
        // a snapshot: later changes to the object must not alter an event already sent
        data: { object: structuredClone(object) },
      };
      queue = queue.then(() => deliver(event));
      return event;
    },
    /** Every attempt so far, oldest first. */
    deliveries: (): readonly WebhookDelivery[] => deliveries,
    /** Resolves once everything queued has been delivered or given up. */
    idle: (): Promise<void> => queue,
  };
}

export type WebhookSender = ReturnType<typeof createWebhookSender>;
