import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ChannelAlertsAnswer } from '@shared/contract/alerts.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { alertsRootKey } from './get-alert-rules.ts';

/** `GET /api/v1/labs/:lab/channels/:channelId/alerts?from&to`: alerts overlapping the range. */
export function getChannelAlerts(slug: string, channelId: number, from: number, to: number): Promise<ChannelAlertsAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/channels/${channelId}/alerts?from=${from}&to=${to}`);
}

export const channelAlertsQueryOptions = (slug: string, channelId: number, from: number, to: number) =>
  queryOptions({
    queryKey: [...alertsRootKey(slug), 'channel', channelId, from, to],
    queryFn: () => getChannelAlerts(slug, channelId, from, to),
    placeholderData: keepPreviousData,
  });

/** A channel's alerts over the chart's range (for bands on the readings chart). */
export function useChannelAlerts(slug: string, channelId: number, range: { from: number; to: number }, enabled = true) {
  return useQuery({ ...channelAlertsQueryOptions(slug, channelId, range.from, range.to), enabled });
}
