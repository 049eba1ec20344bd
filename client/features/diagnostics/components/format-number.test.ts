import { describe, expect, it } from 'vitest';
import { fmtP, fmtSeconds, fmtStat } from './format-number.ts';

// Plain unit arithmetic, worked by hand.
describe('number formatting', () => {
  it('writes durations in their two largest units', () => {
    expect(fmtSeconds(86_400)).toBe('1 d');
    expect(fmtSeconds(7 * 3600 + 45 * 60)).toBe('7 h 45 min');
    expect(fmtSeconds(90)).toBe('1 min 30 s');
    expect(fmtSeconds(86_400 + 60)).toBe('1 d');
    expect(fmtSeconds(0)).toBe('0 s');
  });

  it('writes statistics and p-values', () => {
    expect(fmtStat(0.123456)).toBe('0.1235');
    expect(fmtStat(Number.NaN)).toBe('—');
    expect(fmtP(0.00001)).toBe('< 0.0001');
    expect(fmtP(0.31234)).toBe('0.3123');
  });
});
