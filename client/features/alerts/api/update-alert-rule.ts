import type { AlertRuleAnswer, UpdateAlertRuleInput } from '@shared/contract/alerts.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `PATCH /api/v1/labs/:lab/alert-rules/:ruleId`. */
export function updateAlertRule(slug: string, ruleId: number, input: UpdateAlertRuleInput): Promise<AlertRuleAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules/${ruleId}`, { method: 'PATCH', body: JSON.stringify(input) });
}

/** Changes a rule (e.g. turns it off or on), then refreshes the lab's alert queries. */
export function useUpdateAlertRule(slug: string, ruleId: number) {
  return useRefreshingMutation(alertsRootKey(slug), (input: UpdateAlertRuleInput) => updateAlertRule(slug, ruleId, input));
}
