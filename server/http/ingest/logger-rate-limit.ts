import { AppError } from '../../errors.ts';

/** 429 with the seconds to wait, for a logger that posts faster than its allowance. */
export class RateLimitedError extends AppError {
  constructor(override readonly retryAfterSeconds: number) {
    super(429, 'rate_limited', `Too many requests from this logger; retry in ${retryAfterSeconds} s.`);
  }
}

/**
 * A token bucket per logger (in this process): `perSecond` requests on average with bursts of
 * `burst`. Several app servers each keep their own buckets, so the limit is per server —
 * enough to stop a runaway logger from starving the others.
 */
export function createLoggerRateLimit({ perSecond, burst, now = Date.now }: { perSecond: number; burst: number; now?: () => number }) {
  const buckets = new Map<number, { tokens: number; at: number }>();
  return {
    /** Takes one token for `loggerId` or throws RateLimitedError. */
    take(loggerId: number): void {
      const t = now();
      const b = buckets.get(loggerId) ?? { tokens: burst, at: t };
      b.tokens = Math.min(burst, b.tokens + ((t - b.at) / 1000) * perSecond);
      b.at = t;
      if (b.tokens < 1) {
        buckets.set(loggerId, b);
        throw new RateLimitedError(Math.max(1, Math.ceil((1 - b.tokens) / perSecond)));
      }
      b.tokens -= 1;
      buckets.set(loggerId, b);
      if (buckets.size > 100_000) buckets.clear();
    },
  };
}
