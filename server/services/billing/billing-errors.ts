import { AppError } from '../../errors.ts';
import type { LimitName } from './plan-catalog.ts';

/** How long a refused logger should wait before trying again (seconds): usage changes slowly. */
export const PLAN_LIMIT_RETRY_AFTER_S = 3600;

const WHAT: Record<LimitName, string> = {
  readings: 'stored readings',
  loggers: 'loggers',
  members: 'members (with pending invitations)',
  quarantinedRows: 'quarantined rows',
};

/**
 * The lab's plan does not allow this (a batch past the stored-readings limit, one logger or
 * member too many). HTTP 402 with `plan_limit_reached` and Retry-After: nothing was written,
 * and the same request succeeds once an admin raises the plan (or usage drops).
 */
export class PlanLimitError extends AppError {
  override readonly retryAfterSeconds = PLAN_LIMIT_RETRY_AFTER_S;

  constructor(
    readonly limit: LimitName,
    detail: { planName: string; allowed: number; used: number; adding: number },
  ) {
    super(
      402,
      'plan_limit_reached',
      `The lab's ${detail.planName} plan allows ${detail.allowed} ${WHAT[limit]}; ${detail.used} are in use and this would add ${detail.adding}. ` +
        (limit === 'quarantinedRows'
          ? 'Nothing of this batch was saved, its good readings included. A technician can make room by discarding or re-submitting quarantined rows, or a lab admin can raise the limit under Billing; retry after that.'
          : 'Nothing was saved. A lab admin can raise the limit under Billing; retry after that.'),
    );
  }
}

/** Stripe could not be reached or refused the call; nothing about the lab's plan changed. */
export class BillingUnavailableError extends AppError {
  override readonly retryAfterSeconds = 30;

  constructor(message = 'The payment service cannot be reached right now; your plan is unchanged. Try again in a few minutes.') {
    super(503, 'billing_unavailable', message);
  }
}
