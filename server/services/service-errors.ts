import { AppError } from '../errors.ts';

/** A change that would leave a lab without any admin; the last admin may delete the lab instead (Lab settings). */
export class LastAdminError extends AppError {
  constructor() {
    super(409, 'last_admin', 'A lab needs at least one admin: make someone else admin first, or delete the lab under Lab settings if it is no longer needed.');
  }
}

/** The request conflicts with the current state (duplicate, already done, taken name). */
export class ConflictError extends AppError {
  constructor(code: string, message: string) {
    super(409, code, message);
  }
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
