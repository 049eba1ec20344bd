import type { NextFunction, Request, Response } from 'express';

/** Stripe's error types (Stripe API reference, "Errors"). */
export type StripeErrorType = 'api_error' | 'card_error' | 'idempotency_error' | 'invalid_request_error';

/**
 * An error the stand-in answers the way Stripe does: an HTTP status plus
 * `{ error: { type, code, message, param } }`, which the official SDK turns into its typed
 * errors (400/404 → StripeInvalidRequestError, 401 → StripeAuthenticationError).
 */
export class StripeApiError extends Error {
  readonly status: number;
  readonly type: StripeErrorType;
  readonly code: string | undefined;
  readonly param: string | undefined;

  constructor(status: number, type: StripeErrorType, message: string, details: { code?: string; param?: string } = {}) {
    super(message);
    this.name = 'StripeApiError';
    this.status = status;
    this.type = type;
    this.code = details.code;
    this.param = details.param;
  }
}

/** 404 `resource_missing`, as Stripe answers for an id it does not know. */
export function resourceMissing(resource: string, id: string): StripeApiError {
  return new StripeApiError(404, 'invalid_request_error', `No such ${resource}: '${id}'`, {
    code: 'resource_missing',
    param: 'id',
  });
}

/** 400 `parameter_unknown`, as Stripe answers a parameter the endpoint does not take. */
export function parameterUnknown(param: string): StripeApiError {
  return new StripeApiError(400, 'invalid_request_error', `Received unknown parameter: ${param}`, {
    code: 'parameter_unknown',
    param,
  });
}

/** 400 for a parameter of the wrong shape; no `code`, since we do not know which one Stripe would pick. */
export function parameterInvalid(param: string, message: string): StripeApiError {
  return new StripeApiError(400, 'invalid_request_error', message, { param });
}

/** Express error middleware that renders StripeApiError (and anything unexpected, as api_error 500). */
export function renderStripeError(error: unknown, _req: Request, res: Response, next: NextFunction): void {
  if (res.headersSent) {
    next(error);
    return;
  }
  const known =
    error instanceof StripeApiError
      ? error
      : new StripeApiError(500, 'api_error', `Stripe stand-in failed: ${error instanceof Error ? error.message : String(error)}`);
  res.status(known.status).json({
    error: { type: known.type, code: known.code, message: known.message, param: known.param },
  });
}
