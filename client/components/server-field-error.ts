import { ApiError } from '../lib/api-client.ts';

/**
 * Splits an older server message written as `field: reason` (e.g. "email: an invitation to
 * this address is already pending") into the form field it names and the reason, when that
 * field is one of `fields`. Anything else returns null. Only a fallback: answers now name their
 * refused fields by key in `ApiError.fields` (see fieldFromServerError).
 */
export function fieldFromServerMessage<F extends string>(message: string, fields: readonly F[]): { field: F; reason: string } | null {
  const match = /^([A-Za-z][\w.]*):\s*(.+)$/s.exec(message);
  if (!match) return null;
  const field = fields.find((f) => f === match[1]);
  return field ? { field, reason: match[2] } : null;
}

/**
 * Every refused field of a failed submission that belongs to the form, with the plain reason to
 * show beside it: from the answer's structured `fields` (by key), else from the old text form.
 */
export function fieldsFromServerError<F extends string>(error: unknown, fields: readonly F[]): Array<{ field: F; reason: string }> {
  if (error instanceof ApiError && error.fields.length > 0) {
    return error.fields.flatMap((p) => {
      const field = fields.find((f) => f === p.field);
      return field ? [{ field, reason: p.reason }] : [];
    });
  }
  const named = error instanceof Error ? fieldFromServerMessage(error.message, fields) : null;
  return named ? [named] : [];
}

/** The first refused field of the form in a failed submission (see fieldsFromServerError), or null. */
export function fieldFromServerError<F extends string>(error: unknown, fields: readonly F[]): { field: F; reason: string } | null {
  return fieldsFromServerError(error, fields)[0] ?? null;
}

/**
 * Puts a failed submission's errors where the person will look for them: each refused field the
 * form has gets its plain reason (by the answer's `fields`, or the field `codeFields` assigns to
 * its error code); anything the form cannot place — a field it does not show, or a message about
 * the request as a whole — goes on the form (`root.server`). Written for react-hook-form's `setError`.
 */
export function applyServerError<F extends string>(
  error: unknown,
  fields: readonly F[],
  setError: (name: F | 'root.server', error: { type: string; message: string }) => void,
  codeFields: Partial<Record<string, F>> = {},
): void {
  const message = error instanceof Error ? error.message : 'The request failed.';
  const placed = fieldsFromServerError(error, fields);
  for (const { field, reason } of placed) setError(field, { type: 'server', message: reason });
  const all = error instanceof ApiError ? error.fields : [];
  if (placed.length > 0 && placed.length >= all.length) return;
  if (placed.length > 0) {
    // refused fields this form does not show: say them on the form, with their labels
    const rest = all.filter((p) => !placed.some((q) => q.field === p.field));
    return setError('root.server', { type: 'server', message: rest.map((p) => `${p.label}: ${p.reason}.`).join(' ') });
  }
  const byCode = error instanceof ApiError ? codeFields[error.code] : undefined;
  if (byCode) return setError(byCode, { type: 'server', message: error instanceof ApiError && error.fields.length === 1 ? error.fields[0].reason : message });
  setError('root.server', { type: 'server', message });
}
