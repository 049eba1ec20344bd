import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

export type ChannelStatus = 'live' | 'silent' | 'out-of-range' | 'no-data';

/** The logger a channel belongs to, as the channel answers carry it. */
export interface ChannelLogger {
  id: number;
  name: string;
  site: string | null;
  timezone: string;
  expectedIntervalS: number;
}

/** A channel with its logger, status and latest reading (times are epoch ms and ISO strings, UTC). */
export interface ChannelState {
  id: number;
  loggerId: number;
  key: string;
  label: string;
  unit: string | null;
  quantity: string | null;
  validMin: number | null;
  validMax: number | null;
  expectedIntervalS: number | null;
  seasonalPeriodHint: number | null;
  retiredAt: string | null;
  logger: ChannelLogger;
  status: ChannelStatus;
  statusIntervalS: number;
  lastReading: { ts: number; time: string; value: number } | null;
  dataVersion: number;
}

/** One row of the overview: the channel plus 24 hourly means (null = no reading that hour). */
export interface ChannelOverviewRow extends ChannelState {
  sparkline: { startHour: number; stepS: number; means: Array<number | null> };
}

export const channelsBase = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/channels`;

/** `GET /api/v1/labs/:lab/channels`: every channel that is not retired, with `now` as the server saw it. */
export function getChannels(slug: string): Promise<{ now: number; channels: ChannelOverviewRow[] }> {
  return apiFetch(channelsBase(slug));
}

/** The prefix of every channel query of a lab. */
export const channelsRootKey = (slug: string) => ['labs', slug, 'channels'] as const;

export const channelsQueryOptions = (slug: string) => queryOptions({ queryKey: [...channelsRootKey(slug), 'overview'], queryFn: () => getChannels(slug) });

/** The lab's channels overview, re-read every minute so statuses stay current. */
export function useChannels(slug: string) {
  return useQuery({ ...channelsQueryOptions(slug), refetchInterval: 60_000 });
}
