import { describe, expect, it } from 'vitest';
import { autocorrelation } from './autocorrelation.ts';
import { ljungBox } from './ljung-box.ts';

// R 4.2.2, datasets::lh: Box.test(lh, lag = 10, type = "Ljung-Box") → X-squared = 25.350930360500232,
// p-value = 0.0047185565952562181 (sprintf("%.17g", …)).
const LH = [
  2.4, 2.4, 2.4, 2.2, 2.1, 1.5, 2.3, 2.3, 2.5, 2, 1.9, 1.7, 2.2, 1.8, 3.2, 3.2, 2.7, 2.2, 2.2, 1.9, 1.9, 1.8, 2.7, 3, 2.3, 2, 2, 2.9, 2.9, 2.7, 2.7, 2.3, 2.6,
  2.4, 1.8, 1.7, 1.5, 1.4, 2.1, 3.3, 3.5, 3.5, 3.1, 2.6, 2.1, 3.4, 3, 2.9,
];

describe('ljungBox', () => {
  it("matches R's Box.test on lh, computing the ACF itself or reading a longer ACF it is given", () => {
    const own = ljungBox(LH, { lag: 10 });
    const given = ljungBox(LH, { lag: 10, acf: autocorrelation(LH, { maxLag: 20 }) });
    for (const r of [own, given]) {
      expect(Math.abs(r.statistic - 25.350930360500232)).toBeLessThan(1e-10);
      expect(Math.abs(r.pValue - 0.0047185565952562181)).toBeLessThan(1e-12);
      expect(r.df).toBe(10);
    }
  });

  it('refuses an ACF that stops below the lag', () => {
    expect(() => ljungBox(LH, { lag: 10, acf: autocorrelation(LH, { maxLag: 9 }) })).toThrow('ljungBox: the given acf stops at lag 9, below lag 10');
  });
});
