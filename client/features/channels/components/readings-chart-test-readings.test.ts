import { describe, expect, it } from 'vitest';
import type { EChartsCoreOption } from 'echarts/core';
import type { ReadingsSeries } from '@shared/contract/channels.ts';
import { readingsChartOption, testReadingsSummary, withTestReadings } from './readings-chart-option.ts';

// A small invented series (demo values) in the API's shape; expectations worked by hand.
const T0 = Date.parse('2026-01-10T00:00:00Z');
const raw: ReadingsSeries = {
  shape: 'readings',
  source: 'raw',
  resolutionS: null,
  bucketMs: null,
  from: T0,
  to: T0 + 4 * 60_000,
  t: [T0, T0 + 60_000, T0 + 120_000, T0 + 180_000],
  value: [10, 12, null, 14],
};
const ctx = { label: 'Air', unit: '°C', timezone: 'UTC', validMin: -40, validMax: 60, range: { from: T0, to: T0 + 4 * 60_000 } };
const seriesOf = (o: EChartsCoreOption) => o.series as Array<Record<string, unknown>>;

describe('test readings on the readings chart', () => {
  it('are a separate scatter series named "Test reading", drawn as outlined diamonds, never joined to the readings’ line', () => {
    const base = readingsChartOption(raw, ctx);
    const option = withTestReadings(base, [{ ts: T0 + 120_000, value: 30 }], raw, ctx);
    const all = seriesOf(option);
    expect(all.slice(0, -1)).toEqual(seriesOf(base)); // the readings are drawn exactly as before
    const line = all.find((s) => s.name === 'Reading')!;
    const tests = all[all.length - 1];
    expect(tests).toMatchObject({ name: 'Test reading', type: 'scatter', symbol: 'diamond', data: [[T0 + 120_000, 30]] });
    expect(tests.itemStyle).toEqual({ color: '#ffffff', borderColor: '#6b3fa0', borderWidth: 2 });
    // another shape and another look than the reading points and the out-of-range triangles
    expect(tests.symbol).not.toBe(line.symbol ?? 'emptyCircle');
    expect(tests.symbol).not.toBe('triangle');
    // the line's own data has no point at the test reading's time (it stays a gap)
    expect((line.data as Array<[number, number | null]>).find(([t]) => t === T0 + 120_000)).toEqual([T0 + 120_000, null]);
  });

  it('draws a value far off the chart at its edge, labelled with the real value, instead of squashing the readings', () => {
    // extent of readings and limits: −40…60, widened by half its span (50) each way: −90…110
    const option = withTestReadings(
      readingsChartOption(raw, ctx),
      [
        { ts: T0 + 60_000, value: -99999 },
        { ts: T0, value: 100 },
      ],
      raw,
      ctx,
    );
    const [onScale, off] = seriesOf(option).slice(-2);
    expect(onScale).toMatchObject({ name: 'Test reading', data: [[T0, 100]] });
    expect(off.name).toBe('Test reading (off the scale)');
    expect(off.data).toEqual([{ value: [T0 + 60_000, -90], label: expect.objectContaining({ show: true, formatter: 'test -99999' }) }]);
  });

  it('leaves the option untouched without test readings in the range, and says in words what is drawn', () => {
    const base = readingsChartOption(raw, ctx);
    expect(withTestReadings(base, [{ ts: T0 - 1, value: 1 }], raw, ctx)).toBe(base);
    expect(testReadingsSummary([], ctx)).toBe('');
    expect(testReadingsSummary([{ ts: T0, value: 21.5 }], ctx)).toBe(
      ' 1 test reading (21.5 °C) drawn apart as hollow diamonds: not among the readings, left out of diagnostics and alerts.',
    );
  });
});
