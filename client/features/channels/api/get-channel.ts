import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import { channelsBase, channelsRootKey, type ChannelState } from './get-channels.ts';

/** One channel with the extent of its readings (`readingCount` from the daily rollups). */
export interface ChannelDetail extends ChannelState {
  firstReading: { ts: number; time: string } | null;
  readingCount: number;
}

/** `GET /api/v1/labs/:lab/channels/:channelId`. */
export function getChannel(slug: string, channelId: number): Promise<{ channel: ChannelDetail }> {
  return apiFetch(`${channelsBase(slug)}/${channelId}`);
}

export const channelQueryOptions = (slug: string, channelId: number) =>
  queryOptions({ queryKey: [...channelsRootKey(slug), 'one', channelId], queryFn: () => getChannel(slug, channelId) });

/** One channel of the lab; a 404 ApiError when there is no such channel in this lab. */
export function useChannel(slug: string, channelId: number) {
  return useQuery(channelQueryOptions(slug, channelId));
}
