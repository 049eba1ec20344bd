import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertRulesAnswer } from '@shared/contract/alerts.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** Every alert query of a lab (rules, alerts, channel bands) lives under this key. */
export const alertsRootKey = (slug: string) => ['labs', slug, 'alerts'] as const;

/** `GET /api/v1/labs/:lab/alert-rules`. */
export function getAlertRules(slug: string): Promise<AlertRulesAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules`);
}

export const alertRulesQueryOptions = (slug: string) => queryOptions({ queryKey: [...alertsRootKey(slug), 'rules'], queryFn: () => getAlertRules(slug) });

/** The lab's alert rules. */
export function useAlertRules(slug: string) {
  return useQuery(alertRulesQueryOptions(slug));
}
