import { ApiError } from '../lib/api-client.ts';

/**
 * Splits a server message written as `field: reason` (the API's convention for validation
 * and conflict messages, e.g. "email: an invitation to this address is already pending")
 * into the form field it names and the reason, when that field is one of `fields`.
 * Anything else returns null, so the caller shows the whole message for the form instead.
 */
export function fieldFromServerMessage<F extends string>(message: string, fields: readonly F[]): { field: F; reason: string } | null {
  const match = /^([A-Za-z][\w.]*):\s*(.+)$/s.exec(message);
  if (!match) return null;
  const field = fields.find((f) => f === match[1]);
  return field ? { field, reason: match[2] } : null;
}

/**
 * Puts a failed submission's error where the person will look for it: on the field the
 * server's message names (or the field `codeFields` assigns to its error code), otherwise
 * on the form as a whole (`root.server`). Written for react-hook-form's `setError`.
 */
export function applyServerError<F extends string>(
  error: unknown,
  fields: readonly F[],
  setError: (name: F | 'root.server', error: { type: string; message: string }) => void,
  codeFields: Partial<Record<string, F>> = {},
): void {
  const message = error instanceof Error ? error.message : 'The request failed.';
  const named = fieldFromServerMessage(message, fields);
  if (named) return setError(named.field, { type: 'server', message: named.reason });
  const byCode = error instanceof ApiError ? codeFields[error.code] : undefined;
  if (byCode) return setError(byCode, { type: 'server', message });
  setError('root.server', { type: 'server', message });
}
