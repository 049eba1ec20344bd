import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError } from '../../errors.ts';

/** How many requests one caller may make in one window. */
export interface RateLimit {
  limit: number;
  windowMs: number;
}

/** The limits on the routes an attacker can call cheaply and repeatedly. */
export interface RateLimits {
  /** `GET /auth/sign-in` and `GET /auth/callback`, each counted per client IP. */
  signIn: RateLimit;
  /** Creating and resending invitations (each sends mail), counted per signed-in person. */
  invitations: RateLimit;
}

/** Defaults: 60 sign-in starts or callbacks per IP per 5 minutes; 30 invitation mails per admin per hour. */
export const DEFAULT_RATE_LIMITS: RateLimits = {
  signIn: { limit: 60, windowMs: 5 * 60_000 },
  invitations: { limit: 30, windowMs: 60 * 60_000 },
};

/** Fills the limits a caller did not set with the defaults. */
export function resolveRateLimits(overrides: Partial<RateLimits> = {}): RateLimits {
  return { ...DEFAULT_RATE_LIMITS, ...overrides };
}

/** Too many requests from one caller or person (not a logger: see logger-rate-limit.ts); `Retry-After` says when to try again. */
export class TooManyAttemptsError extends AppError {
  constructor(message: string) {
    super(429, 'rate_limited', message);
  }
}

function limiter(rule: RateLimit, message: string, key: (req: Request) => string): RequestHandler {
  return rateLimit({
    windowMs: rule.windowMs,
    limit: rule.limit,
    // Sets Retry-After on a 429 and the IETF RateLimit headers on every answer.
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new TooManyAttemptsError(message)),
  });
}

/**
 * A per-client-IP limit for the sign-in redirects (IPv6 callers are grouped by /56 so one
 * host cannot dodge it by rotating addresses). Each call makes a limiter with its own counts,
 * held in this process's memory: with several app processes each counts on its own.
 */
export function perClientLimit(rule: RateLimit, what: string): RequestHandler {
  return limiter(rule, `Too many ${what} from your address; try again later.`, (req) => ipKeyGenerator(req.ip ?? 'unknown'));
}

/**
 * A per-person limit for signed-in actions that cost something (mail sent on their behalf).
 * Put it after the guard that signs the person in; an anonymous caller is counted by IP.
 */
export function perPersonLimit(rule: RateLimit, what: string): RequestHandler {
  return limiter(rule, `Too many ${what} in a short time; try again later.`, (req) =>
    req.user ? `user:${req.user.id}` : `addr:${ipKeyGenerator(req.ip ?? 'unknown')}`,
  );
}
