import { apiFetch } from '../../../lib/api-client.ts';
import type { IssuedKeyAnswer } from '@shared/contract/loggers.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/keys`: issues a new ingest key. With `rotate`, every
 * other key of the logger stops working at once.
 */
export function issueKey(slug: string, loggerId: number, rotate: boolean): Promise<IssuedKeyAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/keys`, { method: 'POST', body: JSON.stringify({ rotate }) });
}

/** Issues (or rotates to) a new key, then refreshes the lab's logger queries. */
export function useIssueKey(slug: string, loggerId: number) {
  return useLoggersMutation(slug, (rotate: boolean) => issueKey(slug, loggerId, rotate));
}
