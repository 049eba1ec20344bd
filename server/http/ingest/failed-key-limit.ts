import { createHash } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError } from '../../errors.ts';
import type { RateLimit } from '../middleware/rate-limits.ts';

/** Default: 20 wrong ingest keys per client address per minute, then 429 until the minute is over. */
export const DEFAULT_FAILED_KEY_LIMIT: RateLimit = { limit: 20, windowMs: 60_000 };

/** 429 for an address that sent too many wrong ingest keys; `Retry-After` says when the window ends. */
export class TooManyWrongKeysError extends AppError {
  constructor(override readonly retryAfterSeconds: number) {
    super(429, 'too_many_wrong_keys', `Too many wrong ingest keys from your address; retry in ${retryAfterSeconds} s. Check the key the logger sends.`);
  }
}

const KNOWN_GOOD_MS = 60 * 60_000;
const KNOWN_GOOD_MAX = 100_000;

/**
 * Throttles failed ingest-key lookups per client address (IPv6 grouped by /56), counted in this
 * process only (several app processes each count on their own): only answers of 401 count, so
 * valid loggers never use up the allowance. Once an address is over the limit its requests are
 * answered 429 without a database lookup — except a key that authenticated in this process in
 * the last hour, so a working logger behind the same address (a shared NAT) keeps posting while
 * a misconfigured or hostile neighbour is held back. Call `remember` after a key authenticates.
 */
export function createFailedKeyLimit(rule: RateLimit = DEFAULT_FAILED_KEY_LIMIT) {
  const knownGood = new Map<string, number>();
  const digestOf = (req: Request): string | null => {
    const header = req.get('authorization');
    return header ? createHash('sha256').update(header).digest('base64') : null;
  };
  const isKnownGood = (req: Request): boolean => {
    const digest = digestOf(req);
    const until = digest ? knownGood.get(digest) : undefined;
    return until !== undefined && until > Date.now();
  };
  const middleware: RequestHandler = rateLimit({
    windowMs: rule.windowMs,
    limit: rule.limit,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
    skip: isKnownGood,
    // count only wrong keys: every other answer (stored, refused body, rate-limited) is taken back
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    handler: (req, _res, next) => {
      const reset = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
      next(new TooManyWrongKeysError(Math.max(1, Math.ceil(((reset?.getTime() ?? Date.now() + rule.windowMs) - Date.now()) / 1000))));
    },
  });
  return {
    middleware,
    /** Marks the request's key as working, so a throttled address still lets it through. */
    remember(req: Request): void {
      const digest = digestOf(req);
      if (!digest) return;
      if (knownGood.size >= KNOWN_GOOD_MAX) knownGood.clear();
      knownGood.set(digest, Date.now() + KNOWN_GOOD_MS);
    },
  };
}
