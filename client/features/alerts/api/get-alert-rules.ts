import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AlertRuleKind } from '../../../../server/contract/alerts.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** An alert rule as listed, with what it watches and whether the viewer is subscribed. */
export interface AlertRule {
  id: number;
  name: string;
  kind: AlertRuleKind;
  channelId: number | null;
  loggerId: number | null;
  params: Record<string, unknown>;
  reminderAfterMin: number | null;
  enabled: boolean;
  createdAt: string;
  updatedAt: string;
  watched: { channelId: number | null; loggerId: number; label: string; loggerName: string; unit: string };
  subscribed: boolean;
  openAlertId: number | null;
}

/** Every alert query of a lab (rules, alerts, channel bands) lives under this key. */
export const alertsRootKey = (slug: string) => ['labs', slug, 'alerts'] as const;

/** `GET /api/v1/labs/:lab/alert-rules`. */
export function getAlertRules(slug: string): Promise<{ rules: AlertRule[] }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/alert-rules`);
}

export const alertRulesQueryOptions = (slug: string) => queryOptions({ queryKey: [...alertsRootKey(slug), 'rules'], queryFn: () => getAlertRules(slug) });

/** The lab's alert rules. */
export function useAlertRules(slug: string) {
  return useQuery(alertRulesQueryOptions(slug));
}
