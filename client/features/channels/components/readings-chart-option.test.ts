import { describe, expect, it } from 'vitest';
import type { BucketSeries, ReadingsSeries } from '@shared/contract/channels.ts';
import { cellSizeWords, LIMIT_LABEL_ROOM, outOfRangePoints, readingsChartOption, readingsSummary } from './readings-chart-option.ts';
import {
  BERLIN_MARCH,
  BERLIN_MARCH_MIDNIGHTS,
  BERLIN_OCTOBER,
  BERLIN_OCTOBER_MIDNIGHTS,
  isoTicks,
  type TimeAxis,
} from '../../../components/charts/berlin-midnights.testkit.ts';

// Small invented series (demo values) in the API's documented shapes; expectations worked by hand.
const T0 = Date.parse('2026-01-10T00:00:00Z');
const raw: ReadingsSeries = {
  shape: 'readings',
  source: 'raw',
  resolutionS: null,
  bucketMs: null,
  from: T0,
  to: T0 + 4 * 60_000,
  t: [T0, T0 + 60_000, T0 + 120_000, T0 + 180_000],
  value: [1, 72, null, -50],
};
const buckets: BucketSeries = {
  shape: 'buckets',
  source: 'rollup',
  resolutionS: 3600,
  bucketMs: 7_200_000,
  from: T0,
  to: T0 + 14_400_000,
  t: [T0, T0 + 7_200_000],
  min: [-45, null],
  max: [65, null],
  mean: [3, null],
  count: [120, 0],
};
const ctx = { label: 'Air', unit: '°C', timezone: 'Europe/Berlin', validMin: -40, validMax: 60, range: { from: T0, to: T0 + 14_400_000 } };

describe('readings chart helpers', () => {
  it('marks raw readings outside the valid range and skips gap markers', () => {
    expect(outOfRangePoints(raw, -40, 60)).toEqual([
      [T0 + 60_000, 72],
      [T0 + 180_000, -50],
    ]);
    expect(outOfRangePoints(raw, null, null)).toEqual([]);
  });

  it('marks a bucket whose extremes leave the range, at the bucket middle', () => {
    expect(outOfRangePoints(buckets, -40, 60)).toEqual([
      [T0 + 3_600_000, 65],
      [T0 + 3_600_000, -45],
    ]);
  });

  it('says in words what the chart shows, on the logger’s clock', () => {
    expect(readingsSummary(raw, ctx)).toBe(
      '3 readings from 2026-01-10 01:00 to 2026-01-10 05:00 (Europe/Berlin, UTC+01:00); lowest -50 °C, highest 72 °C; 2 outside the valid range.',
    );
    const words = readingsSummary(buckets, ctx);
    expect(words).toContain(
      '2 points (each the mean of a 2-hour cell, with the cell’s lowest and highest reading as thin lines above and below; read from stored summaries)',
    );
    expect(words).not.toMatch(/bucket|rollup/i);
    expect(readingsSummary({ ...buckets, source: 'raw' }, ctx)).toContain('worked out from the readings');
  });

  it('puts the time axis ticks at the logger’s local midnights, on 23- and 25-hour days too', () => {
    const march = readingsChartOption(raw, { ...ctx, range: BERLIN_MARCH }).xAxis as TimeAxis;
    expect(isoTicks(march)).toEqual(BERLIN_MARCH_MIDNIGHTS);
    expect(march.axisLabel.customValues).toEqual(march.axisTick.customValues);
    expect(march.axisLabel.customValues.map(march.axisLabel.formatter)).toEqual(['2026-03-27', '03-28', '03-29', '03-30', '03-31']);
    const october = readingsChartOption(raw, { ...ctx, range: BERLIN_OCTOBER }).xAxis as TimeAxis;
    expect(isoTicks(october)).toEqual(BERLIN_OCTOBER_MIDNIGHTS);
  });

  it('names a cell by its size in plain units', () => {
    expect(cellSizeWords(60_000)).toBe('1-minute');
    expect(cellSizeWords(600_000)).toBe('10-minute');
    expect(cellSizeWords(3_600_000)).toBe('hourly');
    expect(cellSizeWords(7_200_000)).toBe('2-hour');
    expect(cellSizeWords(86_400_000)).toBe('daily');
    expect(cellSizeWords(7 * 86_400_000)).toBe('7-day');
    expect(cellSizeWords(30_000)).toBe('30-second');
    expect(cellSizeWords(90_000)).toBe('90-second');
    expect(cellSizeWords(250)).toBe('250-millisecond');
  });

  it('names the envelope and mean lines after the cell size, never "bucket"', () => {
    const names = (s: typeof buckets) => (readingsChartOption(s, ctx).series as Array<{ name: string }>).map((l) => l.name);
    expect(names(buckets)).toEqual(['2-hour maximum', '2-hour minimum', '2-hour mean', 'Outside the valid range']);
    expect(names({ ...buckets, bucketMs: 600_000 }).slice(0, 3)).toEqual(['10-minute maximum', '10-minute minimum', '10-minute mean']);
    expect(names({ ...buckets, bucketMs: 3_600_000 }).slice(0, 3)).toEqual(['Hourly maximum', 'Hourly minimum', 'Hourly mean']);
  });

  it('writes the valid limits in the margin right of the plot, on a background, with their unit', () => {
    const option = readingsChartOption(raw, ctx) as {
      grid: { right: number };
      series: Array<{
        markLine?: { label: { position: string; backgroundColor: string; formatter: (p: { name: string; value: unknown }) => string }; data: unknown[] };
      }>;
    };
    const mark = option.series.find((s) => s.markLine)?.markLine;
    expect(mark?.data).toEqual([
      { yAxis: -40, name: 'valid minimum' },
      { yAxis: 60, name: 'valid maximum' },
    ]);
    // 'end' puts the label past the line's right end, outside the plot where markers are clipped
    expect(mark?.label.position).toBe('end');
    expect(mark?.label.backgroundColor).toMatch(/^#/);
    expect(mark?.label.formatter({ name: 'valid maximum', value: 60 })).toBe('valid maximum\n60 °C');
    expect(option.grid.right).toBe(LIMIT_LABEL_ROOM);
    // limits far from every reading (data −50…72, so −200 and 400 lie beyond a quarter of the span) need no room
    expect((readingsChartOption(raw, { ...ctx, validMin: -200, validMax: 400 }) as { grid: { right: number } }).grid.right).toBeLessThan(LIMIT_LABEL_ROOM);
    const noLimits = readingsChartOption(raw, { ...ctx, validMin: null, validMax: null }) as { grid: { right: number }; series: Array<{ markLine?: unknown }> };
    expect(noLimits.grid.right).toBeLessThan(LIMIT_LABEL_ROOM);
    expect(noLimits.series.some((s) => s.markLine)).toBe(false);
  });
});
