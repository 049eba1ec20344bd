import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `DELETE /api/v1/labs/:lab/alert-rules/:ruleId`: past alerts stay in the history. */
export function deleteAlertRule(slug: string, ruleId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules/${ruleId}`, { method: 'DELETE' });
}

/** Deletes a rule, then refreshes the lab's alert queries. */
export function useDeleteAlertRule(slug: string, ruleId: number) {
  return useRefreshingMutation(alertsRootKey(slug), () => deleteAlertRule(slug, ruleId));
}
