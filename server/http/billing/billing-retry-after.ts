import type { ErrorRequestHandler } from 'express';
import { BillingUnavailableError, PlanLimitError } from '../../services/billing/billing-errors.ts';

/**
 * Adds `Retry-After` to billing refusals — 402 `plan_limit_reached` (loggers retry later) and
 * 503 `billing_unavailable` — before the one error middleware renders them.
 */
export function billingRetryAfter(): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if ((err instanceof PlanLimitError || err instanceof BillingUnavailableError) && !res.headersSent) res.set('Retry-After', String(err.retryAfterSeconds));
    next(err);
  };
}
