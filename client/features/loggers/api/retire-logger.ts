import { apiFetch } from '../../../lib/api-client.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `POST /api/v1/labs/:lab/loggers/:loggerId/retire`: readings are kept; its keys stop working. */
export function retireLogger(slug: string, loggerId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/retire`, { method: 'POST' });
}

/** Retires a logger, then refreshes the lab's logger queries. */
export function useRetireLogger(slug: string, loggerId: number) {
  return useLoggersMutation(slug, () => retireLogger(slug, loggerId));
}
