import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChannelDetailAnswer } from '@shared/contract/channels.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { channelsBase, channelsRootKey } from './get-channels.ts';

/** `GET /api/v1/labs/:lab/channels/:channelId`. */
export function getChannel(slug: string, channelId: number): Promise<ChannelDetailAnswer> {
  return apiFetch(`${channelsBase(slug)}/${channelId}`);
}

export const channelQueryOptions = (slug: string, channelId: number) =>
  queryOptions({ queryKey: [...channelsRootKey(slug), 'one', channelId], queryFn: () => getChannel(slug, channelId) });

/** One channel of the lab; a 404 ApiError when there is no such channel in this lab. */
export function useChannel(slug: string, channelId: number) {
  return useQuery(channelQueryOptions(slug, channelId));
}
