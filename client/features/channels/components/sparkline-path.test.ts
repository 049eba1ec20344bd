import { describe, expect, it } from 'vitest';
import { sparklinePath } from './sparkline-path.ts';

// Expected coordinates worked by hand from the scaling the function documents
// (x = pad + i·(width − 2·pad)/(n − 1), y = pad + (height − 2·pad)·(1 − (v − min)/(max − min))).
describe('sparklinePath', () => {
  it('draws consecutive values as one run scaled to the box', () => {
    expect(sparklinePath([0, 5, 10], 12, 12, 1)).toEqual({ d: 'M1 11 L6 6 L11 1', dots: [] });
  });

  it('leaves a gap where an hour has no reading and shows a lone value as a dot', () => {
    const out = sparklinePath([0, 10, null, 5, null, 0, 10], 14, 12, 1);
    expect(out.d).toBe('M1 11 L3 1 M11 11 L13 1');
    expect(out.dots).toEqual([[7, 6]]);
  });

  it('draws a flat series at mid-height and nothing for an empty one', () => {
    expect(sparklinePath([2, 2], 10, 8, 1).d).toBe('M1 4 L9 4');
    expect(sparklinePath([null, null], 10, 8)).toEqual({ d: '', dots: [] });
  });
});
