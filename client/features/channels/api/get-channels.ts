import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChannelsAnswer } from '@shared/contract/channels.ts';
import { apiFetch } from '../../../lib/api-client.ts';

export const channelsBase = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}/channels`;

/** `GET /api/v1/labs/:lab/channels`: every channel that is not retired, with `now` as the server saw it. */
export function getChannels(slug: string): Promise<ChannelsAnswer> {
  return apiFetch(channelsBase(slug));
}

/** The prefix of every channel query of a lab. */
export const channelsRootKey = (slug: string) => ['labs', slug, 'channels'] as const;

export const channelsQueryOptions = (slug: string) => queryOptions({ queryKey: [...channelsRootKey(slug), 'overview'], queryFn: () => getChannels(slug) });

/** The lab's channels overview, re-read every minute so statuses stay current. */
export function useChannels(slug: string) {
  return useQuery({ ...channelsQueryOptions(slug), refetchInterval: 60_000 });
}
