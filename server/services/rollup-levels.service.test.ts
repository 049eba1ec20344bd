import { describe, expect, it } from 'vitest';
import { monthBounds } from './rollup-levels.service.ts';

describe('monthBounds', () => {
  it('covers the first to the last reading in whole UTC months', () => {
    const first = Date.UTC(2026, 10, 17, 5);
    const last = Date.UTC(2027, 0, 1, 0, 0, 0, 1);
    expect(monthBounds(first, last)).toEqual([Date.UTC(2026, 10, 1), Date.UTC(2026, 11, 1), Date.UTC(2027, 0, 1), Date.UTC(2027, 1, 1)]);
  });

  it('gives one month for readings inside it, including one at its very start', () => {
    const m = Date.UTC(2026, 1, 1);
    expect(monthBounds(m, m)).toEqual([m, Date.UTC(2026, 2, 1)]);
  });
});
