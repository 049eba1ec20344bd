import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangePlanInput, PlanChangeAnswer } from '@shared/contract/billing.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { billingRootKey } from './get-billing.ts';

/**
 * `POST …/billing/plan-change`: moves a paid subscription to another paid plan (202; the plan
 * changes when Stripe confirms). 409 `plan_too_small` when the lab already uses more than the
 * plan allows, unless `acknowledgeLimits` is true.
 */
export function changePlan(slug: string, input: ChangePlanInput): Promise<PlanChangeAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/plan-change`, { method: 'POST', body: JSON.stringify(input) });
}

export function useChangePlan(slug: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangePlanInput) => changePlan(slug, input),
    onSuccess: () => client.invalidateQueries({ queryKey: billingRootKey(slug) }),
  });
}
