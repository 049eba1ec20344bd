import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SeriesAnswer, TimeRange } from '@shared/contract/channels.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { channelsBase, channelsRootKey } from './get-channels.ts';

/** `GET /api/v1/labs/:lab/channels/:channelId/series?from&to&points`. */
export function getSeries(slug: string, channelId: number, range: TimeRange, points: number, signal?: AbortSignal): Promise<SeriesAnswer> {
  const q = new URLSearchParams({ from: String(range.from), to: String(range.to), points: String(points) });
  return apiFetch(`${channelsBase(slug)}/${channelId}/series?${q}`, { signal });
}

export const seriesQueryOptions = (slug: string, channelId: number, range: TimeRange, points = 2000) =>
  queryOptions({
    queryKey: [...channelsRootKey(slug), 'series', channelId, range.from, range.to, points],
    queryFn: ({ signal }) => getSeries(slug, channelId, range, points, signal),
  });

/** The downsampled series of a range; the previous range's series stays shown while a new one loads. */
export function useSeries(slug: string, channelId: number, range: TimeRange, points = 2000) {
  return useQuery({ ...seriesQueryOptions(slug, channelId, range, points), placeholderData: keepPreviousData });
}

/** Link to the readings of `range` as CSV (`readings.csv`; the server streams it as a download). */
export function readingsCsvUrl(slug: string, channelId: number, range: TimeRange): string {
  return `${channelsBase(slug)}/${channelId}/readings.csv?${new URLSearchParams({ from: String(range.from), to: String(range.to) })}`;
}
