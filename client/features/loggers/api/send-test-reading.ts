import type { TestReadingBody, TestReadingResult } from '@shared/contract/loggers.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/test-reading`: stores one reading of a channel now,
 * through the same path a logger's readings take, and reads it back.
 */
export function sendTestReading(slug: string, loggerId: number, input: TestReadingBody): Promise<TestReadingResult> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/test-reading`, { method: 'POST', body: JSON.stringify(input) });
}

/** Sends a test reading, then refreshes the lab's logger queries (the logger was just seen). */
export function useSendTestReading(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (input: TestReadingBody) => sendTestReading(slug, loggerId, input));
}
