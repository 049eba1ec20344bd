import { describe, expect, it } from 'vitest';
import { difference } from './difference.ts';

describe('difference', () => {
  it('matches R diff() semantics on a hand example', () => {
    // diff(c(1, 4, 9, 16, 25), lag = 1, differences = 2) = c(2, 2, 2) (second differences of squares).
    expect(Array.from(difference([1, 4, 9, 16, 25], { order: 2 }))).toEqual([2, 2, 2]);
    // diff(c(1, 4, 9, 16, 25), lag = 2) = c(8, 12, 16)
    expect(Array.from(difference([1, 4, 9, 16, 25], { lag: 2 }))).toEqual([8, 12, 16]);
  });
  it('a missing value spreads to the differences that use it', () => {
    const d = Array.from(difference([1, NaN, 3, 4]));
    expect(d.map(Number.isNaN)).toEqual([true, true, false]);
  });
});
