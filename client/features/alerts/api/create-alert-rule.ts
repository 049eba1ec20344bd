import type { AlertRuleAnswer, CreateAlertRuleInput } from '@shared/contract/alerts.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `POST /api/v1/labs/:lab/alert-rules`: makes a rule; its maker is subscribed. */
export function createAlertRule(slug: string, input: CreateAlertRuleInput): Promise<AlertRuleAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules`, { method: 'POST', body: JSON.stringify(input) });
}

/** Makes a rule, then refreshes the lab's alert queries. */
export function useCreateAlertRule(slug: string) {
  return useRefreshingMutation(alertsRootKey(slug), (input: CreateAlertRuleInput) => createAlertRule(slug, input));
}
