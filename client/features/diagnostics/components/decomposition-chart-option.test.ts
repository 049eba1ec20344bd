import { describe, expect, it } from 'vitest';
import { observedFromParts } from './decomposition-chart-option.ts';

// The additive identity observed = trend + seasonal + remainder (Cleveland et al. 1990, eq. 1 —
// equation number from memory); parts invented for the test.
describe('observedFromParts', () => {
  it('adds the parts back and leaves empty or incomplete cells missing', () => {
    const d = {
      method: 'classical' as const,
      period: 2,
      trend: [null, 10, 11, 12],
      seasonal: [1, -1, 1, -1],
      remainder: [null, 0.5, 0.25, -0.5],
      weights: null,
      outliers: { threshold: 3, median: 0, robustSd: 1, indices: [], times: [], values: [] },
    };
    expect(observedFromParts(d, [])).toEqual([null, 9.5, 12.25, 10.5]);
    expect(observedFromParts(d, [2])).toEqual([null, 9.5, null, 10.5]);
  });
});
