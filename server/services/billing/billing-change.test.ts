import type Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { billingChange, mirrorStatus } from './billing-change.ts';
import { billingRow, testCatalog } from './billing-test-fixtures.ts';
import { warningLevel } from './usage-job.ts';
import type { LabBilling } from '../../db/lab-billing.repo.ts';

// Event shapes follow the Stripe API reference (Event, Subscription, Invoice.parent, Checkout Session).
const catalog = testCatalog;
const ctx = { catalog, graceDays: 7 };
const row = (over: Partial<LabBilling> = {}) => billingRow({ stateAt: 1000, ...over });
const event = (type: string, created: number, object: object) => ({ id: 'evt_1', object: 'event', type, created, data: { object } }) as unknown as Stripe.Event;
const invoice = (sub: string) => ({
  id: 'in_1',
  object: 'invoice',
  customer: 'cus_1',
  parent: { type: 'subscription_details', subscription_details: { subscription: sub, metadata: {} } },
});

describe('billingChange', () => {
  it('a failed payment starts a grace period of graceDays after the event; a second failure keeps its end', () => {
    const first = billingChange(event('invoice.payment_failed', 2000, invoice('sub_1')), row(), ctx);
    expect(first).toEqual({ status: 'past_due', graceUntil: new Date((2000 + 7 * 86400) * 1000), stateAt: 2000 });
    const second = billingChange(
      event('invoice.payment_failed', 3000, invoice('sub_1')),
      row({ status: 'past_due', graceUntil: first!.graceUntil!, stateAt: 2000 }),
      ctx,
    );
    expect(second?.graceUntil).toEqual(first!.graceUntil);
  });

  it('a paid invoice ends the grace period; invoices of another subscription change nothing', () => {
    expect(billingChange(event('invoice.paid', 2000, invoice('sub_1')), row({ status: 'past_due', graceUntil: new Date(5e9) }), ctx)).toEqual({
      status: 'active',
      graceUntil: null,
      stateAt: 2000,
    });
    expect(billingChange(event('invoice.paid', 2000, invoice('sub_other')), row({ status: 'past_due' }), ctx)).toBeNull();
  });

  it('ignores state from an event older than the newest applied, but still links missing ids', () => {
    const late = event('checkout.session.completed', 500, {
      mode: 'subscription',
      payment_status: 'paid',
      customer: 'cus_1',
      subscription: 'sub_1',
      metadata: { plan_key: 'transect' },
    });
    expect(billingChange(late, row({ planKey: 'seedling', status: 'canceled', stripeSubscriptionId: null, stateAt: 1000 }), ctx)).toEqual({
      stripeSubscriptionId: 'sub_1',
    });
  });

  it('maps Stripe subscription statuses onto active, past due and cancelled', () => {
    expect(
      ['active', 'trialing', 'past_due', 'unpaid', 'canceled', 'incomplete_expired', 'incomplete', 'paused'].map((s) =>
        mirrorStatus(s as Stripe.Subscription.Status),
      ),
    ).toEqual(['active', 'active', 'past_due', 'past_due', 'canceled', 'canceled', null, null]);
  });

  it('a deletion of another subscription than the lab’s does not cancel the lab', () => {
    expect(billingChange(event('customer.subscription.deleted', 2000, { id: 'sub_old', status: 'canceled' }), row(), ctx)).toBeNull();
  });
});

describe('warningLevel', () => {
  it('is 0 below 80%, 80 from exactly 80%, 100 from exactly the limit', () => {
    expect([warningLevel(79, 100), warningLevel(80, 100), warningLevel(99, 100), warningLevel(100, 100), warningLevel(120, 100)]).toEqual([
      0, 80, 80, 100, 100,
    ]);
    expect(warningLevel(7, 9)).toBe(0); // 77.8%
    expect(warningLevel(8, 10)).toBe(80);
  });
});
