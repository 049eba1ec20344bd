import { apiFetch } from '../../../lib/api-client.ts';
import type { CreateLoggerBody } from '../../../../server/http/loggers/loggers.schema.ts';
import type { IngestKeyInfo, LoggerDetail } from './get-logger.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** A freshly issued ingest key: the one answer that carries the whole key. */
export type IssuedKey = IngestKeyInfo & { key: string; shownOnce: true };

/**
 * `POST /api/v1/labs/:lab/loggers`: registers a logger with its channels and issues its first
 * ingest key. 409 `logger_name_taken` ("name: …") when the lab already has that name.
 */
export function createLogger(slug: string, input: CreateLoggerBody): Promise<{ logger: LoggerDetail; ingestKey: IssuedKey }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers`, { method: 'POST', body: JSON.stringify(input) });
}

/** Registers a logger, then refreshes the lab's logger lists. */
export function useCreateLogger(slug: string) {
  return useLoggersMutation(slug, (input: CreateLoggerBody) => createLogger(slug, input));
}
