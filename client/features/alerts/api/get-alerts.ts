import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertsAnswer } from '@shared/contract/alerts.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `GET /api/v1/labs/:lab/alerts`: open alerts and those opened in the last `days` days. */
export function getAlerts(slug: string, days = 7): Promise<AlertsAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alerts?days=${days}`);
}

export const alertsQueryOptions = (slug: string, days = 7) =>
  queryOptions({ queryKey: [...alertsRootKey(slug), 'list', days], queryFn: () => getAlerts(slug, days), refetchInterval: 30_000 });

/** Open and recent alerts of the lab (refreshed every 30 s while shown). */
export function useAlerts(slug: string, days = 7) {
  return useQuery(alertsQueryOptions(slug, days));
}
