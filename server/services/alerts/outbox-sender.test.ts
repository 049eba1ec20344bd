import { describe, expect, it } from 'vitest';
import { fullJitterDelayMs } from '../../db/retry-transaction.ts';
import { CLAIM_MS, MARK_SENT_RETRY } from './outbox-sender.ts';

/** An error as mysql2 reports it, with MariaDB's code. */
const dbError = (code: string, errno = 0) => Object.assign(new Error(code), { code, errno });

describe('marking a sent alert mail rides out a database failover', () => {
  it('retries a lost connection, a node that is not ready and a lock conflict, nothing else', () => {
    const retried = [dbError('PROTOCOL_CONNECTION_LOST'), dbError('ECONNREFUSED'), dbError('ER_UNKNOWN_COM_ERROR', 1047), dbError('ER_LOCK_DEADLOCK', 1213)];
    expect(retried.map((e) => MARK_SENT_RETRY.retryWhen(e))).toEqual([true, true, true, true]);
    expect(MARK_SENT_RETRY.retryWhen(dbError('ER_PARSE_ERROR', 1064))).toBe(false);
  });

  it('keeps trying for longer than a writer failover at the most drawn waits (over 10 s; 4–5 s measured)', () => {
    const almostOne = 1 - Number.EPSILON;
    let longest = 0;
    for (let attempt = 1; attempt < MARK_SENT_RETRY.attempts; attempt++)
      longest += fullJitterDelayMs(attempt, MARK_SENT_RETRY.baseMs, MARK_SENT_RETRY.capMs, () => almostOne);
    expect(longest).toBeGreaterThan(10_000);
    expect(longest).toBeLessThan(CLAIM_MS); // and end well within the claim the sender holds on the message
  });
});
