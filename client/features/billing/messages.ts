import type { BillingStatus } from '@shared/contract/billing.ts';

/**
 * Words the billing screens write themselves (the plan's state, notices after a checkout or a
 * switch, hints beside the plans). This file is the one place to review how the billing feature
 * speaks to people; field labels the server shares live in `@shared/contract/words/billing.ts`.
 * The payment service is named by its job, never by its product or its event names.
 */

/** The plan's state as people read it (never the stored status value). */
export const PLAN_STATE_WORDS: Record<BillingStatus, string> = {
  active: 'paid, active',
  past_due: 'payment overdue',
  canceled: 'subscription cancelled',
  none: 'free',
};

export const BILLING_NOTICES = {
  graceOver: 'A payment failed and the grace period is over: the free plan’s limits apply until the invoice is paid.',
  cancelled: 'The subscription was cancelled: the lab is on the free plan. Nothing was deleted.',
  checkoutCancelled: 'Checkout was cancelled; nothing was charged and the plan is unchanged.',
  paymentWaiting: 'Payment received — waiting for confirmation from the payment service. This page updates by itself.',
  storageFull:
    'Storage is full: new batches from the loggers are refused (they are told to retry later and keep their readings). Stored data stays readable. Choose a larger plan to accept them again.',
  settleFirst: 'Settle the overdue payment under “Manage payment” to switch',
  cancelFirst: 'Cancel the subscription to return here',
  updatesItself: 'This page updates by itself.',
} as const;

/** After a checkout or a switch the payment service has confirmed. */
export const planConfirmed = (planName: string, how: 'payment' | 'switch'): string =>
  `${how === 'payment' ? 'Payment' : 'Switch'} confirmed: the lab is now on the ${planName} plan.`;
