import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RetentionAnswer } from '@shared/contract/retention.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { billingRootKey } from './get-billing.ts';

/** `GET /api/v1/labs/:lab/billing/retention`: whether the plan removes readings, and which and when. */
export function getRetention(slug: string): Promise<RetentionAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/billing/retention`);
}

export const retentionQueryOptions = (slug: string) => queryOptions({ queryKey: [...billingRootKey(slug), 'retention'], queryFn: () => getRetention(slug) });

/** What the lab's plan removes from storage and when (admins). */
export function useRetention(slug: string) {
  return useQuery(retentionQueryOptions(slug));
}
