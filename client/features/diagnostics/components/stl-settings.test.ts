import { describe, expect, it } from 'vitest';
import { stlSettingRows } from './stl-settings.ts';

describe('stlSettingRows', () => {
  // The defaults R 4.2.2 stats::stl() fills in for a period of 12 with s.window = 7 (its formulas:
  // t.window = nextodd(ceiling(1.5·12 / (1 − 1.5/7))) = 23, l.window = nextodd(12) = 13, each jump
  // ceiling(window/10), degrees 0/1/1, inner 2, outer 0); worked by hand from those formulas.
  const nonRobust = {
    period: 12,
    periodic: false,
    seasonalWindow: 7,
    seasonalDegree: 0,
    seasonalJump: 1,
    trendWindow: 23,
    trendDegree: 1,
    trendJump: 3,
    lowpassWindow: 13,
    lowpassDegree: 1,
    lowpassJump: 2,
    inner: 2,
    outer: 0,
  };

  it('lists the settings in the paper’s order with its symbols, in plain words', () => {
    const rows = stlSettingRows(nonRobust);
    // Cleveland et al. (1990) §3 introduce n(p), n(i), n(o), n(l), n(t), n(s) in this order (from memory of the paper)
    expect(rows.map((r) => r.symbol)).toEqual(['n(p)', 'n(i)', 'n(o)', 'n(l)', 'n(t)', 'n(s)']);
    expect(rows.map((r) => r.name)).toEqual([
      'Cycle length',
      'Inner passes',
      'Robustness passes',
      'Low-pass window',
      'Trend window',
      'Seasonal smoothing window',
    ]);
    expect(rows[0].value).toBe('12 steps in one cycle of the seasonal pattern');
    expect(rows[2].value).toBe('0 (every value counts alike)');
    expect(rows[3].value).toBe('13 steps, local straight line, fitted at every 2nd value and joined by straight lines between');
    expect(rows[4].value).toContain('23 steps, local straight line, fitted at every 3rd value');
    expect(stlSettingRows({ ...nonRobust, trendJump: 11 })[4].value).toContain('every 11th value');
    expect(stlSettingRows({ ...nonRobust, trendJump: 21 })[4].value).toContain('every 21st value');
    expect(rows[5].value).toBe('7 cycles (each point of the cycle is smoothed across that many neighbouring cycles), local mean, fitted at every value');
  });

  it('says what a robust fit and a periodic seasonal window mean, with no other language’s argument names', () => {
    const rows = stlSettingRows({ ...nonRobust, periodic: true, seasonalWindow: 10 * 500 + 1, inner: 1, outer: 15 });
    expect(rows[1].value).toMatch(/^1 /);
    expect(rows[2].value).toBe('15 (after each, values far from the fit count for less in the next)');
    expect(rows[5].value).toBe('all cycles: the same seasonal shape repeats in every cycle');
    const text = JSON.stringify(rows);
    expect(text).not.toMatch(/s\.window|t\.window|l\.window|robust\s*=|periodic"|Jump|Window|Degree/);
  });
});
