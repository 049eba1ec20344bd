import { describe, expect, it } from 'vitest';
import { outlierRule } from './outlier-rule.ts';

// Invented figures in the API's documented shape; the words only have to match the rule the server states.
const base = { threshold: 3, median: 0.0123, robustSd: 0.456, indices: [4], times: [0], values: [2] };

describe('outlierRule', () => {
  it('quotes the whole-remainder figures only when the whole remainder was the yardstick', () => {
    expect(outlierRule(base)).toBe('|remainder − 0.0123| > 3 × 0.456');
  });

  it('says each cell was judged at its own point of the cycle when positions were pooled', () => {
    expect(outlierRule({ ...base, pooledPhases: 2 })).toBe(
      'more than 3 robust standard deviations from the median of the remainder at the same point of the cycle, pooled with 2 positions on each side',
    );
    expect(outlierRule({ ...base, pooledPhases: 0 })).toBe(
      'more than 3 robust standard deviations from the median of the remainder at the same point of the cycle',
    );
    expect(outlierRule({ ...base, pooledPhases: 1 })).toMatch(/pooled with 1 position on each side$/);
  });
});
