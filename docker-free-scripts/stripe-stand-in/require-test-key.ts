import type { NextFunction, Request, Response } from 'express';
import { StripeApiError } from './stripe-api-error.ts';

/**
 * Accepts only `Authorization: Bearer sk_test_…` and answers 401 otherwise, as Stripe does
 * for a missing or unknown key. Refusing live-mode keys keeps a misconfigured app from
 * treating the stand-in as the real service.
 */
export function requireTestKey(req: Request, _res: Response, next: NextFunction): void {
  const header = req.get('authorization') ?? '';
  const match = /^Bearer (\S+)$/.exec(header);
  if (!match) {
    next(new StripeApiError(401, 'invalid_request_error', 'You did not provide an API key. Send it as a Bearer token in the Authorization header.'));
    return;
  }
  if (!/^sk_test_\w+$/.test(match[1])) {
    const shown = `${match[1].slice(0, 8)}****`;
    next(new StripeApiError(401, 'invalid_request_error', `Invalid API Key provided: ${shown}. The Stripe stand-in accepts only sk_test_ keys.`));
    return;
  }
  next();
}
