import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertRuleKind } from '../../../../server/contract/alerts.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** One alert: when and why it opened, whether and when it resolved, and its acknowledgement. */
export interface Alert {
  id: number;
  ruleId: number;
  ruleName: string;
  kind: AlertRuleKind;
  channelId: number | null;
  loggerId: number | null;
  open: boolean;
  openedAt: number;
  openedValue: number | null;
  openedDetail: string;
  resolvedAt: number | null;
  resolvedValue: number | null;
  resolvedDetail: string | null;
  remindersSent: number;
  acknowledged: { at: string; by: { name: string; email: string } | null; note: string | null } | null;
}

/** `GET /api/v1/labs/:lab/alerts`: open alerts and those opened in the last `days` days. */
export function getAlerts(slug: string, days = 7): Promise<{ alerts: Alert[]; now: number }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alerts?days=${days}`);
}

export const alertsQueryOptions = (slug: string, days = 7) =>
  queryOptions({ queryKey: [...alertsRootKey(slug), 'list', days], queryFn: () => getAlerts(slug, days), refetchInterval: 30_000 });

/** Open and recent alerts of the lab (refreshed every 30 s while shown). */
export function useAlerts(slug: string, days = 7) {
  return useQuery(alertsQueryOptions(slug, days));
}
