import type { z } from 'zod';
import { apiFetch } from '../../../lib/api-client.ts';
import type { channelPatchSchema } from '../../../../server/http/loggers/loggers.schema.ts';
import type { Channel } from './get-logger.ts';
import { useLoggersMutation } from './logger-mutation.ts';

export type ChannelPatch = z.output<typeof channelPatchSchema>;

/** `PATCH /api/v1/labs/:lab/loggers/:loggerId/channels/:channelId`. */
export function updateChannel(slug: string, loggerId: number, channelId: number, patch: ChannelPatch): Promise<{ channel: Channel }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/channels/${channelId}`, {
    method: 'PATCH',
    body: JSON.stringify(patch),
  });
}

/** Saves a channel's settings, then refreshes the lab's logger queries. */
export function useUpdateChannel(slug: string, loggerId: number, channelId: number) {
  return useLoggersMutation(slug, (patch: ChannelPatch) => updateChannel(slug, loggerId, channelId, patch));
}
