import { useMutation } from '@tanstack/react-query';
import type { BillingSessionAnswer, StartCheckoutInput } from '@shared/contract/billing.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** `POST …/billing/checkout-session`: the Stripe Checkout URL for a paid plan. */
export function startCheckout(slug: string, input: StartCheckoutInput): Promise<BillingSessionAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/checkout-session`, { method: 'POST', body: JSON.stringify(input) });
}

/** `POST …/billing/portal-session`: the billing-portal URL (card, invoices, cancellation). */
export function openPortal(slug: string): Promise<BillingSessionAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/portal-session`, { method: 'POST' });
}

/** Leaves for the page Stripe answered (Checkout or the portal); the plan changes only when Stripe confirms. */
export function useStartCheckout(slug: string) {
  return useMutation({ mutationFn: (input: StartCheckoutInput) => startCheckout(slug, input), onSuccess: ({ url }) => window.location.assign(url) });
}

export function useOpenPortal(slug: string) {
  return useMutation({ mutationFn: () => openPortal(slug), onSuccess: ({ url }) => window.location.assign(url) });
}
