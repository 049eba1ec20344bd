import { describe, expect, it } from 'vitest';
import type { EChartsCoreOption } from 'echarts/core';
import type { ReadingsSeries } from '@shared/contract/channels.ts';
import { projectionSummary, readingsChartOption, withProjection, type ChartProjection } from './readings-chart-option.ts';

// A small invented cold-room series (demo values) and projection; expectations worked by hand.
const T0 = Date.parse('2026-12-03T12:00:00Z');
const series: ReadingsSeries = {
  shape: 'readings',
  source: 'raw',
  resolutionS: null,
  bucketMs: null,
  from: T0,
  to: T0 + 30 * 60_000,
  t: [T0, T0 + 10 * 60_000, T0 + 20 * 60_000, T0 + 30 * 60_000],
  value: [7.4, 7.5, 7.6, 7.7],
};
const ctx = { label: 'Air', unit: '°C', timezone: 'UTC', validMin: null, validMax: null, range: { from: T0, to: T0 + 30 * 60_000 } };
const projection: ChartProjection = {
  model: 'ARIMA(0,1,0) on the remainder after the daily cycle',
  limit: 8,
  side: 'high',
  horizonMin: 20,
  chance: 0.62,
  interval: { level: 0.8, lower: 7.2, upper: 8.3 },
  from: T0 + 30 * 60_000,
  path: [
    { at: T0 + 40 * 60_000, mean: 7.75, lower: 7.4, upper: 8.1 },
    { at: T0 + 50 * 60_000, mean: 7.8, lower: 7.2, upper: 8.3 },
  ],
};
type Drawn = { name?: string; data: number[][]; stack?: string; markLine?: { data: { yAxis: number }[]; label: { formatter: string } } };

describe('the projection on the readings chart', () => {
  const base = readingsChartOption(series, ctx);
  const drawn = withProjection(base, projection, ctx);
  const added = (drawn.series as Drawn[]).slice((base.series as unknown[]).length);

  it('draws the course dashed, the band as lower edge plus width, and the limit named with its value', () => {
    expect(added.map((s) => s.name)).toEqual([undefined, '80 % projection band', 'Projected course']);
    expect(added[0].data).toEqual([
      [T0 + 40 * 60_000, 7.4],
      [T0 + 50 * 60_000, 7.2],
    ]);
    // stacked: the band's top is lower + width = upper
    expect(added[1].data.map(([, w], i) => Number((w + added[0].data[i][1]).toFixed(9)))).toEqual([8.1, 8.3]);
    expect(added[0].stack).toBe(added[1].stack);
    expect(added[2].data.map(([, m]) => m)).toEqual([7.75, 7.8]);
    expect(added[2].markLine!.data).toEqual([{ yAxis: 8, name: 'rule limit' }]);
    expect(added[2].markLine!.label.formatter).toBe('limit 8 °C');
  });

  it('widens the time axis to the projection’s end and names the course and band in the legend', () => {
    expect((drawn.xAxis as { max: number }).max).toBe(T0 + 50 * 60_000);
    expect((drawn.legend as { data: string[] }).data).toEqual(expect.arrayContaining(['Projected course', '80 % projection band']));
    expect((drawn.legend as { data: string[] }).data).toHaveLength((base.series as unknown[]).length + 2);
  });

  it('draws the interval at the horizon alone when the answer has no path', () => {
    const bare = withProjection(base, { ...projection, path: undefined }, ctx);
    const course = (bare.series as Drawn[]).find((s) => s.name === 'Projected course')!;
    expect(course.data).toEqual([[T0 + 50 * 60_000, 7.75]]);
  });

  it('leaves the chart alone without a projection or for one outside the range', () => {
    expect(withProjection(base, null, ctx)).toBe(base);
    const elsewhere: EChartsCoreOption = withProjection(base, { ...projection, from: T0 - 3_600_000 }, ctx);
    expect(elsewhere).toBe(base);
    expect(projectionSummary(null, ctx)).toBe('');
  });

  it('says the projection in the figure caption', () => {
    expect(projectionSummary(projection, ctx)).toBe(
      ' Early warning: projected 20 minutes ahead (ARIMA(0,1,0) on the remainder after the daily cycle), dashed, with its 80 % band shaded; chance of passing the limit 8 °C: p ≈ 0.62.',
    );
  });
});
