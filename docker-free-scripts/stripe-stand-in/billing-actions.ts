import { resourceMissing, StripeApiError } from './stripe-api-error.ts';
import { stripeId, unixNow } from './stripe-objects.ts';
import type { StandInState, StripeInvoice, StripeSubscription } from './stand-in-state.ts';
import type { WebhookSender } from './webhook-sender.ts';

const MONTH_S = 30 * 86400;

/**
 * What the stand-in's hosted pages (and tests) do to subscriptions, each emitting the events
 * Stripe would send for it, in Stripe's order. `baseUrl` is the stand-in's own address, for
 * hosted invoice links.
 */
export function createBillingActions(state: StandInState, webhooks: WebhookSender, baseUrl: () => string) {
  let invoiceSeq = 0;

  function subscription(id: string): StripeSubscription {
    const sub = state.subscriptions.get(id);
    if (!sub) throw resourceMissing('subscription', id);
    return sub;
  }

  function issueInvoice(sub: StripeSubscription, paid: boolean): StripeInvoice {
    const price = sub.items.data[0].price;
    const id = stripeId('in');
    const invoice: StripeInvoice = {
      id,
      object: 'invoice',
      created: unixNow(),
      livemode: false,
      customer: sub.customer,
      number: `LBSI-${String(++invoiceSeq).padStart(4, '0')}`,
      status: paid ? 'paid' : 'open',
      currency: price.currency,
      amount_due: price.unit_amount,
      amount_paid: paid ? price.unit_amount : 0,
      amount_remaining: paid ? 0 : price.unit_amount,
      hosted_invoice_url: `${baseUrl()}/invoices/${id}`,
      invoice_pdf: null,
      parent: { type: 'subscription_details', quote_details: null, subscription_details: { subscription: sub.id, metadata: { ...sub.metadata } } },
    };
    state.invoices.set(id, invoice);
    return invoice;
  }

  return {
    /** The test card was accepted: subscription created, first invoice paid, session completed. */
    completeCheckout(sessionId: string): string {
      const session = state.checkoutSessions.get(sessionId);
      if (!session) throw resourceMissing('checkout.session', sessionId);
      if (session.status !== 'open') throw new StripeApiError(400, 'invalid_request_error', 'This Checkout Session is no longer open.');
      const price = state.prices.get(session.line_price);
      if (!price) throw resourceMissing('price', session.line_price);
      const now = unixNow();
      const sub: StripeSubscription = {
        id: stripeId('sub'),
        object: 'subscription',
        created: now,
        livemode: false,
        customer: session.customer,
        status: 'active',
        metadata: { ...session.subscription_metadata },
        cancel_at_period_end: false,
        canceled_at: null,
        items: {
          object: 'list',
          data: [{ id: stripeId('si'), object: 'subscription_item', price, quantity: 1, current_period_start: now, current_period_end: now + MONTH_S }],
          has_more: false,
          url: '/v1/subscription_items',
        },
      };
      state.subscriptions.set(sub.id, sub);
      webhooks.emit('customer.subscription.created', sub);
      webhooks.emit('invoice.paid', issueInvoice(sub, true));
      session.status = 'complete';
      session.payment_status = 'paid';
      session.subscription = sub.id;
      session.url = null;
      webhooks.emit('checkout.session.completed', session);
      return session.success_url;
    },

    /** A renewal payment failed: an open invoice, the subscription past due. */
    failRenewal(subscriptionId: string): void {
      const sub = subscription(subscriptionId);
      if (sub.status === 'canceled') throw new StripeApiError(400, 'invalid_request_error', 'This subscription is cancelled.');
      const invoice = issueInvoice(sub, false);
      sub.status = 'past_due';
      webhooks.emit('invoice.payment_failed', invoice);
      webhooks.emit('customer.subscription.updated', sub);
    },

    /** The customer paid every open invoice of the subscription: it is active again. */
    payOpenInvoices(subscriptionId: string): void {
      const sub = subscription(subscriptionId);
      for (const invoice of state.invoices.values()) {
        if (invoice.status !== 'open' || invoice.parent.subscription_details.subscription !== sub.id) continue;
        invoice.status = 'paid';
        invoice.amount_paid = invoice.amount_due;
        invoice.amount_remaining = 0;
        webhooks.emit('invoice.paid', invoice);
      }
      if (sub.status === 'past_due') {
        sub.status = 'active';
        webhooks.emit('customer.subscription.updated', sub);
      }
    },

    /**
     * Moves the subscription's one item to another price (Stripe's `POST /v1/subscriptions/:id`
     * with `items[0][id]` and `items[0][price]`): the difference is prorated onto the next
     * invoice, as Stripe's default `proration_behavior` does, so no invoice is issued now.
     */
    changePrice(subscriptionId: string, itemId: string, priceId: string, metadata: Record<string, string> | undefined): StripeSubscription {
      const sub = subscription(subscriptionId);
      if (sub.status === 'canceled')
        throw new StripeApiError(400, 'invalid_request_error', 'A canceled subscription can only update its cancellation_details and metadata.');
      const item = sub.items.data.find((i) => i.id === itemId);
      if (!item) throw resourceMissing('subscription_item', itemId);
      const price = state.prices.get(priceId);
      if (!price) throw resourceMissing('price', priceId);
      item.price = price;
      if (metadata) sub.metadata = { ...sub.metadata, ...metadata };
      webhooks.emit('customer.subscription.updated', sub);
      return sub;
    },

    /** Cancels the subscription at once (Stripe's `DELETE /v1/subscriptions/:id`). */
    cancel(subscriptionId: string): StripeSubscription {
      const sub = subscription(subscriptionId);
      if (sub.status !== 'canceled') {
        sub.status = 'canceled';
        sub.canceled_at = unixNow();
        webhooks.emit('customer.subscription.deleted', sub);
      }
      return sub;
    },
  };
}

export type BillingActions = ReturnType<typeof createBillingActions>;
