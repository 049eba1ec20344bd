import { AppError, ValidationError } from '../errors.ts';
import { problemsMessage, type FieldProblem } from '../contract/words/fields.ts';

/** A change that would leave a lab without any admin; the last admin may delete the lab instead (Lab settings). */
export class LastAdminError extends AppError {
  constructor() {
    super(409, 'last_admin', 'A lab needs at least one admin: make someone else admin first, or delete the lab under Lab settings if it is no longer needed.');
  }
}

/** The request conflicts with the current state (duplicate, already done, taken name); `fields` names the field at fault. */
export class ConflictError extends AppError {
  constructor(code: string, message: string, fields?: FieldProblem[]) {
    super(409, code, message, fields);
  }
}

/**
 * A service's refusal of one field (a check the schema cannot make: a kind that is retired, a
 * plan not offered), written like a schema's: `Label: reason.`, the field by key in `fields`.
 */
export function fieldRefusal(field: string, label: string, reason: string): ValidationError {
  return new ValidationError(problemsMessage([{ label, reason }]), [{ field, label, reason }]);
}

/** A conflict about one field (a taken name or key): 409 with `code`, `Label: reason.` and the field by key. */
export function fieldConflict(code: string, field: string, label: string, reason: string): ConflictError {
  return new ConflictError(code, problemsMessage([{ label, reason }]), [{ field, label, reason }]);
}

/** The thing existed but can no longer be used (an expired, used or revoked invitation). */
export class GoneError extends AppError {
  constructor(code: string, message: string) {
    super(410, code, message);
  }
}

/** True for MariaDB's duplicate-key error. */
export function isDuplicateKey(err: unknown): boolean {
  return (err as { code?: string } | null)?.code === 'ER_DUP_ENTRY';
}
