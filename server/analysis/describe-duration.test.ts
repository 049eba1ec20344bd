import { describe, expect, it } from 'vitest';
import { describeDuration } from './describe-duration.ts';

describe('describeDuration', () => {
  it('uses the largest whole unit, hours with one decimal between 2 h and 2 d, else two decimals', () => {
    expect(describeDuration(300_000)).toBe('5 min');
    expect(describeDuration(86_400_000)).toBe('1 d');
    expect(describeDuration(7_200_000)).toBe('2 h');
    expect(describeDuration(385 * 60_000)).toBe('6.4 h');
    expect(describeDuration(90_000)).toBe('90 s');
    expect(describeDuration(90_500)).toBe('1.51 min');
    expect(describeDuration(500)).toBe('500 ms');
  });
});
