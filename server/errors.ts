/**
 * Typed application errors. Each carries the HTTP status it maps to and a stable `code`
 * that clients and tests can rely on; the one error middleware renders them as
 * `{ "error": { "code": "...", "message": "..." } }`. An error that sets `retryAfterSeconds`
 * (a refusal the caller may simply repeat later) is answered with a `Retry-After` header.
 */
export class AppError extends Error {
  readonly retryAfterSeconds?: number;

  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

/** The request is not signed in (or the session ended). */
export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthenticated', message);
  }
}

/** Signed in, but the role does not allow this. */
export class ForbiddenError extends AppError {
  constructor(message = 'Your role in this lab does not allow this.') {
    super(403, 'forbidden', message);
  }
}

/** Nothing here — also the answer for another lab's resources, so their existence never leaks. */
export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'not_found', message);
  }
}

/** Input failed validation; messages read `field: reason`. */
export class ValidationError extends AppError {
  constructor(message: string, details?: unknown) {
    super(400, 'invalid_input', message, details);
  }
}

/** A dependency (the database, the identity provider) is unreachable; the client may retry. */
export class ServiceUnavailableError extends AppError {
  constructor(
    message: string,
    override readonly retryAfterSeconds = 5,
  ) {
    super(503, 'service_unavailable', message);
  }
}

/**
 * Configuration that cannot work. Raised at start; the entry point prints the message
 * and exits non-zero without a stack trace.
 */
export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}
