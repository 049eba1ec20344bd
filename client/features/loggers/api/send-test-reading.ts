import type { TestReadingBody, TestReadingResult } from '@shared/contract/loggers.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/test-reading`: checks one reading of a channel now as
 * a logger's reading would be checked and keeps it as a test reading (never among the channel's
 * readings). A value outside the valid range answers 409 `outside_valid_range` unless
 * `confirmOutsideRange` is set.
 */
export function sendTestReading(slug: string, loggerId: number, input: TestReadingBody): Promise<TestReadingResult> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/test-reading`, { method: 'POST', body: JSON.stringify(input) });
}

/** Sends a test reading, then refreshes the lab's logger queries (its recent test readings among them). */
export function useSendTestReading(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (input: TestReadingBody) => sendTestReading(slug, loggerId, input));
}
