import { describe, expect, it } from 'vitest';
import { loggerStatus } from './logger-status.tsx';

// The rule mirrors the channels' "silent" status (server/contract/channels.ts: no reading for
// more than 3 × the expected interval); checked at its edges.
const NOW = Date.UTC(2026, 11, 3, 12, 0, 0);
const ago = (s: number) => new Date(NOW - s * 1000).toISOString();

describe('loggerStatus', () => {
  it('is silent only after more than 3 × the expected interval without a reading', () => {
    expect(loggerStatus({ retiredAt: null, lastSeenAt: ago(1800), expectedIntervalS: 600 }, NOW)).toBe('reporting');
    expect(loggerStatus({ retiredAt: null, lastSeenAt: ago(1801), expectedIntervalS: 600 }, NOW)).toBe('silent');
  });

  it('says when a logger has never been heard from, and retired wins over everything', () => {
    expect(loggerStatus({ retiredAt: null, lastSeenAt: null, expectedIntervalS: 60 }, NOW)).toBe('not-heard');
    expect(loggerStatus({ retiredAt: ago(10), lastSeenAt: ago(99_999), expectedIntervalS: 60 }, NOW)).toBe('retired');
  });
});
