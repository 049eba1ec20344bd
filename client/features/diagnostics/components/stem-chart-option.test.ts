import { describe, expect, it } from 'vitest';
import { lagsOutsideBand, stemChartOption, stemSummary } from './stem-chart-option.ts';

// Correlogram values invented for the test; the band rule |r_k| > band_k is the usual reading of
// a correlogram (Box, Jenkins, Reinsel & Ljung 2015, §2.1.6; common practice).
describe('stem chart helpers', () => {
  const lags = [1, 2, 3, 4];
  const values = [0.8, -0.05, 0.3, null];

  it('lists lags outside their band, strongest first', () => {
    expect(lagsOutsideBand(lags, values, () => 0.2)).toEqual([
      { lag: 1, value: 0.8 },
      { lag: 3, value: 0.3 },
    ]);
    const bartlett = [0.1, 0.4, 0.45, 0.5];
    expect(lagsOutsideBand(lags, values, (i) => bartlett[i])).toEqual([{ lag: 1, value: 0.8 }]);
  });

  it('words the result for screen readers', () => {
    expect(stemSummary('ACF', [{ lag: 1, value: 0.8 }], 'Bartlett band')).toBe('ACF: 1 lag outside the Bartlett band; strongest lag 1 (0.800).');
    expect(stemSummary('PACF', [], 'white-noise band')).toBe('PACF: no lag leaves the white-noise band.');
  });

  it('draws both bands as legend entries when Bartlett is given, only white noise otherwise', () => {
    const withBoth = stemChartOption({ name: 'ACF', lags, values, whiteNoise: 0.2, bartlett: [0.2, 0.3, 0.3, 0.3], xName: 'Lag' }) as {
      legend: { data: string[] };
      series: unknown[];
    };
    expect(withBoth.legend.data).toEqual(['ACF', 'White-noise band ±z/√n', 'Bartlett band (MA null up to the previous lag)']);
    expect(withBoth.series).toHaveLength(6);
    const pacf = stemChartOption({ name: 'PACF', lags, values, whiteNoise: 0.2, xName: 'Lag' }) as { legend: { data: string[] }; series: unknown[] };
    expect(pacf.legend.data).toEqual(['PACF', 'White-noise band ±z/√n']);
    expect(pacf.series).toHaveLength(4);
  });

  it('draws the band over all lags as its own solid legend entry and writes lags with the given labels', () => {
    const o = stemChartOption({
      name: 'CCF',
      lags: [-1, 0, 1],
      values: [0.1, 0.2, 0.3],
      whiteNoise: 0.05,
      simultaneous: { halfWidth: 0.08, label: 'All lags' },
      lagLabel: (k) => `${k * 5} min`,
      xName: 'Lag',
    }) as {
      legend: { data: string[] };
      series: Array<{ name: string; data: unknown[]; lineStyle?: { type: string } }>;
      xAxis: { data: string[] };
    };
    expect(o.legend.data).toEqual(['CCF', 'White-noise band ±z/√n', 'All lags']);
    const all = o.series.filter((x) => x.name === 'All lags');
    expect(all.map((x) => [x.data, x.lineStyle?.type])).toEqual([
      [[0.08, 0.08, 0.08], 'solid'],
      [[-0.08, -0.08, -0.08], 'solid'],
    ]);
    expect(o.xAxis.data).toEqual(['-5 min', '0 min', '5 min']);
  });
});
