/** First retry after this long; each further failure doubles it, up to {@link MAX_RETRY_MS}. */
export const FIRST_RETRY_MS = 30_000;
export const MAX_RETRY_MS = 3_600_000;

/**
 * How long to wait before sending a failed notification again after its `attempts`-th failure:
 * exponential back-off (30 s, 1 min, 2 min … capped at 1 h; common practice for retrying a
 * mail relay), so a mail server that is down is not hammered and is retried for as long as
 * it takes.
 */
export function retryDelayMs(attempts: number): number {
  if (!Number.isInteger(attempts) || attempts < 1) throw new RangeError(`retryDelayMs: attempts must be a whole number ≥ 1 (got ${attempts})`);
  return Math.min(FIRST_RETRY_MS * 2 ** Math.min(attempts - 1, 30), MAX_RETRY_MS);
}
