import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `PUT` / `DELETE /api/v1/labs/:lab/alert-rules/:ruleId/subscription`: receive a rule's mail or not. */
export function setAlertSubscription(slug: string, ruleId: number, on: boolean): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules/${ruleId}/subscription`, { method: on ? 'PUT' : 'DELETE' });
}

/** Subscribes or unsubscribes the signed-in member, then refreshes the rules. */
export function useSetAlertSubscription(slug: string, ruleId: number) {
  return useRefreshingMutation(alertsRootKey(slug), (on: boolean) => setAlertSubscription(slug, ruleId, on));
}
