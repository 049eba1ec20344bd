import type { AlertAnswer } from '@shared/contract/alerts.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `POST /api/v1/labs/:lab/alerts/:alertId/acknowledge`: someone is on it; reminders stop. */
export function acknowledgeAlert(slug: string, alertId: number, note: string): Promise<AlertAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alerts/${alertId}/acknowledge`, { method: 'POST', body: JSON.stringify({ note }) });
}

/** Acknowledges an alert with a note, then refreshes the lab's alert queries. */
export function useAcknowledgeAlert(slug: string, alertId: number) {
  return useRefreshingMutation(alertsRootKey(slug), (note: string) => acknowledgeAlert(slug, alertId, note));
}
