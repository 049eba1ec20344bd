import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { channelsBase, channelsRootKey } from './get-channels.ts';

/** Raw readings; a `null` value is a gap marker (draw the line broken there). */
export interface ReadingsSeries {
  shape: 'readings';
  source: 'raw';
  from: number;
  to: number;
  t: number[];
  value: Array<number | null>;
}

/** Min/max/mean/count per bucket (a bucket without readings has nulls and count 0). */
export interface BucketSeries {
  shape: 'buckets';
  source: 'rollup' | 'raw';
  resolutionS: number | null;
  bucketMs: number;
  from: number;
  to: number;
  t: number[];
  min: Array<number | null>;
  max: Array<number | null>;
  mean: Array<number | null>;
  count: number[];
}

export type Series = ReadingsSeries | BucketSeries;

/** A time range in epoch ms, `from` inclusive, `to` exclusive. */
export interface TimeRange {
  from: number;
  to: number;
}

/** `GET /api/v1/labs/:lab/channels/:channelId/series?from&to&points`. */
export function getSeries(
  slug: string,
  channelId: number,
  range: TimeRange,
  points: number,
  signal?: AbortSignal,
): Promise<{ series: Series; /** Epoch ms where the lab's plan cut the range's start, or null. */ historyStartsAt: number | null }> {
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
