import { describe, expect, it } from 'vitest';
import { DEFAULT_ATTEMPTS, fullJitterDelayMs, retryTransaction } from './retry-transaction.ts';

/** An error as mysql2 reports it, with MariaDB's code. */
const dbError = (code: string, errno: number) => Object.assign(new Error(code), { code, errno });
const deadlock = () => dbError('ER_LOCK_DEADLOCK', 1213);

/** A sleep that records what it was asked to wait and returns at once. */
function recordingSleep() {
  const waits: number[] = [];
  return { waits, sleep: async (ms: number) => void waits.push(ms) };
}

describe('fullJitterDelayMs', () => {
  // Full Jitter as defined in Brooker, "Exponential Backoff And Jitter", AWS Architecture Blog (2015):
  // sleep = random_between(0, min(cap, base · 2^attempt)); our attempt counts retries from 1.
  it('stays within [0, min(cap, base · 2^(attempt−1))) at both ends of the random draw', () => {
    const almostOne = 1 - Number.EPSILON;
    expect([1, 2, 3, 4, 5].map((a) => fullJitterDelayMs(a, 25, 1000, () => 0))).toEqual([0, 0, 0, 0, 0]);
    expect([1, 2, 3, 4, 5, 6, 7].map((a) => fullJitterDelayMs(a, 25, 1000, () => almostOne))).toEqual([24, 49, 99, 199, 399, 799, 999]);
    expect(fullJitterDelayMs(30, 25, 1000, () => almostOne)).toBe(999);
  });

  it('spreads the waits over the whole interval (not a fixed delay plus noise)', () => {
    let seed = 12345;
    // a linear congruential generator (Numerical Recipes constants) so the draw is repeatable
    const random = () => (seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32;
    const draws = Array.from({ length: 2000 }, () => fullJitterDelayMs(3, 25, 1000, random));
    expect(Math.min(...draws)).toBeLessThan(5);
    expect(Math.max(...draws)).toBeGreaterThan(95);
    expect(Math.max(...draws)).toBeLessThan(100);
    const mean = draws.reduce((a, b) => a + b, 0) / draws.length;
    expect(mean).toBeGreaterThan(45); // uniform on [0, 100): mean 49.5
    expect(mean).toBeLessThan(54);
  });

  it('refuses an attempt number below one', () => {
    expect(() => fullJitterDelayMs(0, 25, 1000, Math.random)).toThrow(/attempt must be a whole number from 1/);
  });
});

describe('retryTransaction', () => {
  it('runs again after a deadlock and returns the later success; waits drawn with full jitter', async () => {
    const { waits, sleep } = recordingSleep();
    let calls = 0;
    const result = await retryTransaction(
      async () => {
        calls++;
        if (calls < 3) throw deadlock();
        return 'stored';
      },
      { sleep, random: () => 0.5, baseMs: 40, capMs: 1000 },
    );
    expect(result).toBe('stored');
    expect(calls).toBe(3);
    expect(waits).toEqual([20, 40]); // 0.5 · 40, 0.5 · 80
  });

  it('retries a lock wait timeout too', async () => {
    const { sleep } = recordingSleep();
    let calls = 0;
    await retryTransaction(
      async () => {
        if (++calls === 1) throw dbError('ER_LOCK_WAIT_TIMEOUT', 1205);
      },
      { sleep },
    );
    expect(calls).toBe(2);
  });

  it(`gives up after ${DEFAULT_ATTEMPTS} attempts by default and passes the last conflict on`, async () => {
    const { waits, sleep } = recordingSleep();
    let calls = 0;
    const seen: number[] = [];
    const failing = retryTransaction(
      async () => {
        calls++;
        throw deadlock();
      },
      { sleep, onRetry: (attempt) => seen.push(attempt) },
    );
    await expect(failing).rejects.toMatchObject({ code: 'ER_LOCK_DEADLOCK' });
    expect(calls).toBe(DEFAULT_ATTEMPTS);
    expect(waits).toHaveLength(DEFAULT_ATTEMPTS - 1);
    expect(seen).toEqual([1, 2, 3]);
  });

  it('honours a chosen number of attempts', async () => {
    const { sleep } = recordingSleep();
    let calls = 0;
    await expect(
      retryTransaction(
        async () => {
          calls++;
          throw deadlock();
        },
        { attempts: 2, sleep },
      ),
    ).rejects.toThrow('ER_LOCK_DEADLOCK');
    expect(calls).toBe(2);
  });

  it('passes any other error through at once, without waiting', async () => {
    const { waits, sleep } = recordingSleep();
    for (const err of [dbError('ER_DUP_ENTRY', 1062), dbError('ER_UNKNOWN_COM_ERROR', 1047), new Error('plain bug')]) {
      let calls = 0;
      await expect(
        retryTransaction(
          async () => {
            calls++;
            throw err;
          },
          { sleep },
        ),
      ).rejects.toBe(err);
      expect(calls).toBe(1);
    }
    expect(waits).toEqual([]);
  });

  it('refuses a bad number of attempts with a clear error', async () => {
    await expect(retryTransaction(async () => 1, { attempts: 0 })).rejects.toThrow(/attempts must be a whole number from 1/);
  });

  it('retries what retryWhen names instead of lock conflicts, and still nothing else', async () => {
    const lost = () => dbError('PROTOCOL_CONNECTION_LOST', 0);
    const { waits, sleep } = recordingSleep();
    const errors = [lost(), lost()];
    let runs = 0;
    const value = await retryTransaction(
      async () => {
        runs++;
        const next = errors.shift();
        if (next) throw next;
        return 'marked';
      },
      { sleep, random: () => 0.5, retryWhen: (err) => (err as { code?: string }).code === 'PROTOCOL_CONNECTION_LOST' },
    );
    expect([value, runs, waits]).toEqual(['marked', 3, [12, 25]]);
    // with that predicate a deadlock is no longer retried
    await expect(retryTransaction(() => Promise.reject(deadlock()), { sleep, retryWhen: () => false })).rejects.toMatchObject({ code: 'ER_LOCK_DEADLOCK' });
  });
});
