import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BillingOverview } from '@shared/contract/billing.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** Every billing query of a lab lives under this key. */
export const billingRootKey = (slug: string) => ['labs', slug, 'billing'] as const;

/** `GET /api/v1/labs/:lab/billing`. */
export function getBilling(slug: string): Promise<BillingOverview> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing`);
}

export const billingQueryOptions = (slug: string) => queryOptions({ queryKey: [...billingRootKey(slug), 'overview'], queryFn: () => getBilling(slug) });

/** True once Stripe's confirmation of a checkout has reached Lagbook (a paid plan, active). */
export const isConfirmed = (o: BillingOverview | undefined): boolean => !!o && o.status === 'active' && o.plan.paid;

/**
 * The lab's plan and usage. With `untilConfirmed` (back from Checkout) it refetches every
 * `pollMs` until the webhook has landed; with `untilPlan` (after a plan switch) until the
 * subscription is on that plan; then it stops.
 */
export function useBilling(slug: string, opts: { untilConfirmed?: boolean; untilPlan?: string | null; pollMs?: number } = {}) {
  const every = opts.pollMs ?? 1500;
  const waiting = (o: BillingOverview | undefined) => (opts.untilConfirmed && !isConfirmed(o)) || (!!opts.untilPlan && o?.subscribedPlanKey !== opts.untilPlan);
  return useQuery({ ...billingQueryOptions(slug), refetchInterval: (query) => (waiting(query.state.data) ? every : false) });
}
