import { apiFetch } from '../../../lib/api-client.ts';
import type { LoggerPatch, UpdatedLoggerAnswer } from '@shared/contract/loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `PATCH /api/v1/labs/:lab/loggers/:loggerId`: name, serial, site, time zone or expected interval. */
export function updateLogger(slug: string, loggerId: number, patch: LoggerPatch): Promise<UpdatedLoggerAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}`, { method: 'PATCH', body: JSON.stringify(patch) });
}

/** Saves a logger's details, then refreshes the lab's logger queries. */
export function useUpdateLogger(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (patch: LoggerPatch) => updateLogger(slug, loggerId, patch));
}
