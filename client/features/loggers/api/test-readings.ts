import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ChannelTestReadingsAnswer, LoggerTestReadingsAnswer } from '@shared/contract/loggers.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { loggersRootKey } from './get-loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

const labBase = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}`;

/** `GET /api/v1/labs/:lab/loggers/:loggerId/test-readings`: the logger's 10 latest test readings, newest first. */
export function getLoggerTestReadings(slug: string, loggerId: number): Promise<LoggerTestReadingsAnswer> {
  return apiFetch(`${labBase(slug)}/loggers/${loggerId}/test-readings`);
}

/** The logger's recent test readings; kept under the lab's logger queries, so sending or removing one refreshes it. */
export function useLoggerTestReadings(slug: string, loggerId: number) {
  return useQuery(
    queryOptions({ queryKey: [...loggersRootKey(slug), 'test-readings', 'logger', loggerId], queryFn: () => getLoggerTestReadings(slug, loggerId) }),
  );
}

/** `GET /api/v1/labs/:lab/channels/:channelId/test-readings?from&to`: a channel's test readings in a range, oldest first. */
export function getChannelTestReadings(slug: string, channelId: number, range: TimeRange, signal?: AbortSignal): Promise<ChannelTestReadingsAnswer> {
  const q = new URLSearchParams({ from: String(range.from), to: String(range.to) });
  return apiFetch(`${labBase(slug)}/channels/${channelId}/test-readings?${q}`, { signal });
}

/** A channel's test readings over the chart's range (the previous range's stay shown while a new one loads). */
export function useChannelTestReadings(slug: string, channelId: number, range: TimeRange) {
  return useQuery({
    queryKey: [...loggersRootKey(slug), 'test-readings', 'channel', channelId, range.from, range.to],
    queryFn: ({ signal }) => getChannelTestReadings(slug, channelId, range, signal),
    placeholderData: keepPreviousData,
  });
}

/** `DELETE /api/v1/labs/:lab/loggers/:loggerId/test-readings/:id`: its sender only, within 10 minutes of sending. */
export function removeTestReading(slug: string, loggerId: number, id: number): Promise<void> {
  return apiFetch(`${labBase(slug)}/loggers/${loggerId}/test-readings/${id}`, { method: 'DELETE' });
}

/** Removes one of the signed-in member's test readings, then refreshes the lab's logger queries. */
export function useRemoveTestReading(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (id: number) => removeTestReading(slug, loggerId, id));
}
