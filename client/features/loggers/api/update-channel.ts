import { apiFetch } from '../../../lib/api-client.ts';
import type { ChannelAnswer, ChannelPatch } from '@shared/contract/loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `PATCH /api/v1/labs/:lab/loggers/:loggerId/channels/:channelId`. */
export function updateChannel(slug: string, loggerId: number, channelId: number, patch: ChannelPatch): Promise<ChannelAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/channels/${channelId}`, {
    method: 'PATCH',
    body: JSON.stringify(patch),
  });
}

/** Saves a channel's settings, then refreshes the lab's logger queries. */
export function useUpdateChannel(slug: string, loggerId: number, channelId: number) {
  return useLoggersMutation(slug, (patch: ChannelPatch) => updateChannel(slug, loggerId, channelId, patch));
}
