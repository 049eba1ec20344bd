import { apiFetch } from '../../../lib/api-client.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `POST /api/v1/labs/:lab/loggers/:loggerId/channels/:channelId/retire`: its readings are kept; new ones are quarantined. */
export function retireChannel(slug: string, loggerId: number, channelId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/channels/${channelId}/retire`, { method: 'POST' });
}

/** Retires a channel, then refreshes the lab's logger queries. */
export function useRetireChannel(slug: string, loggerId: number, channelId: number) {
  return useLoggersMutation(slug, () => retireChannel(slug, loggerId, channelId));
}
