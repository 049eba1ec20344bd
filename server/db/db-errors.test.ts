import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable, isLockConflict, isNodeNotReady } from './db-errors.ts';

/** Errors shaped as mysql2 reports MariaDB's (code and errno from MariaDB's error list). */
const err = (code: string, errno?: number) => Object.assign(new Error(code), { code, errno });

describe('database error classes', () => {
  it('a Galera node that is not ready (1047) is "unavailable" (503), not a bug (500)', () => {
    const notReady = err('ER_UNKNOWN_COM_ERROR', 1047);
    expect(isNodeNotReady(notReady)).toBe(true);
    expect(isDatabaseUnavailable(notReady)).toBe(true);
    expect(isNodeNotReady({ errno: 1047 })).toBe(true);
    expect(isLockConflict(notReady)).toBe(false);
  });

  it('deadlocks (1213, also Galera certification failures) and lock wait timeouts (1205) are lock conflicts', () => {
    expect(isLockConflict(err('ER_LOCK_DEADLOCK', 1213))).toBe(true);
    expect(isLockConflict(err('ER_LOCK_WAIT_TIMEOUT', 1205))).toBe(true);
    expect(isLockConflict({ errno: 1213 })).toBe(true);
    expect(isLockConflict(err('ER_DUP_ENTRY', 1062))).toBe(false);
    expect(isLockConflict(null)).toBe(false);
  });

  it('lost, refused and killed connections are "unavailable"; a wrong query is not', () => {
    for (const code of ['ECONNREFUSED', 'PROTOCOL_CONNECTION_LOST', 'ER_CONNECTION_KILLED', 'ER_SERVER_SHUTDOWN'])
      expect(isDatabaseUnavailable(err(code))).toBe(true);
    expect(isDatabaseUnavailable(Object.assign(new Error('closed state'), { fatal: true }))).toBe(true);
    expect(isDatabaseUnavailable(err('ER_PARSE_ERROR', 1064))).toBe(false);
    expect(isDatabaseUnavailable(err('ER_LOCK_DEADLOCK', 1213))).toBe(false);
    expect(isDatabaseUnavailable(null)).toBe(false);
  });
});
