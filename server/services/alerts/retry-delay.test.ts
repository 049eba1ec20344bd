import { describe, expect, it } from 'vitest';
import { retryDelayMs } from './retry-delay.ts';

describe('retryDelayMs', () => {
  it('doubles from 30 s and stops at one hour (30·2^(n−1) s, by definition)', () => {
    expect([1, 2, 3, 4, 7, 8, 50].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000, 1_920_000, 3_600_000, 3_600_000]);
  });
  it('refuses attempts below 1', () => {
    expect(() => retryDelayMs(0)).toThrow('attempts must be a whole number ≥ 1 (got 0)');
  });
});
