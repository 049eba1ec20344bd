import { apiFetch } from '../../../lib/api-client.ts';
import type { CreateLoggerBody, RegisteredLoggerAnswer } from '@shared/contract/loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/**
 * `POST /api/v1/labs/:lab/loggers`: registers a logger with its channels and issues its first
 * ingest key. 409 `logger_name_taken` ("name: …") when the lab already has that name.
 */
export function createLogger(slug: string, input: CreateLoggerBody): Promise<RegisteredLoggerAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers`, { method: 'POST', body: JSON.stringify(input) });
}

/** Registers a logger, then refreshes the lab's logger lists. */
export function useCreateLogger(slug: string) {
  return useLoggersMutation(slug, (input: CreateLoggerBody) => createLogger(slug, input));
}
