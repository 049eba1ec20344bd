import { apiFetch } from '../../../lib/api-client.ts';
import type { ChannelAnswer, ChannelInputBody } from '@shared/contract/loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `POST /api/v1/labs/:lab/loggers/:loggerId/channels`; 409 `channel_key_taken` for a key the logger already has. */
export function addChannel(slug: string, loggerId: number, input: ChannelInputBody): Promise<ChannelAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/channels`, { method: 'POST', body: JSON.stringify(input) });
}

/** Adds a channel to a logger, then refreshes the lab's logger queries. */
export function useAddChannel(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (input: ChannelInputBody) => addChannel(slug, loggerId, input));
}
