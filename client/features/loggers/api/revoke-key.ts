import { apiFetch } from '../../../lib/api-client.ts';
import { useLoggersMutation } from './logger-mutation.ts';

/** `DELETE /api/v1/labs/:lab/loggers/:loggerId/keys/:keyId`: the key stops working at once. */
export function revokeKey(slug: string, loggerId: number, keyId: number): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/keys/${keyId}`, { method: 'DELETE' });
}

/** Revokes one key, then refreshes the lab's logger queries. */
export function useRevokeKey(slug: string, loggerId: number, keyId: number) {
  return useLoggersMutation(slug, () => revokeKey(slug, loggerId, keyId));
}
