import { describe, expect, it } from 'vitest';
import { aggregationOf, plottedPoints, togetherChartHeight, togetherChartOption, togetherSummary, type DrawnLine } from './together-chart-option.ts';
import { planLines } from './together-lines.ts';
import { BOARDWALK, buckets, fenChannel, readings, WEIR } from './together-fixture.ts';
import {
  BERLIN_MARCH,
  BERLIN_MARCH_MIDNIGHTS,
  BERLIN_OCTOBER,
  BERLIN_OCTOBER_MIDNIGHTS,
  isoTicks,
  type TimeAxis,
} from '../../../components/charts/berlin-midnights.testkit.ts';

const T0 = Date.parse('2026-03-29T00:00:00Z');
const MIN = 60_000;
const RANGE = { from: T0, to: T0 + 120 * MIN };

type Axis = { name: string; position: string; offset: number };
type Line = { name: string; yAxisIndex: number; data: Array<[number, number | null]>; lineStyle: { color: string; type: unknown }; symbol: string };

function setUp(
  channels = [fenChannel(1, 'Air temperature', '°C', WEIR), fenChannel(2, 'Relative humidity', '%', WEIR), fenChannel(3, 'Water temperature', '°C', BOARDWALK)],
) {
  const { lines, axes } = planLines(channels);
  const drawn: DrawnLine[] = lines.map((l, i) => ({
    ...l,
    series: i === 1 ? buckets(T0, 30 * MIN, [80, null, 78, 76]) : readings([T0, T0 + 10 * MIN, T0 + 40 * MIN], [i + 1, null, i + 2]),
  }));
  return { drawn, axes, option: togetherChartOption(drawn, axes, { range: RANGE, zone: 'Europe/Berlin' }) as Record<string, unknown> };
}

describe('togetherChartOption', () => {
  it('draws three channels of two units on two value axes, each line on its unit’s axis', () => {
    const { option } = setUp();
    const yAxis = option.yAxis as Axis[];
    expect(yAxis.map((a) => [a.name, a.position, a.offset])).toEqual([
      ['°C', 'left', 0],
      ['%', 'right', 0],
    ]);
    const series = option.series as Line[];
    expect(series.map((s) => [s.name, s.yAxisIndex])).toEqual([
      ['Weir mast · Air temperature (°C)', 0],
      ['Weir mast · Relative humidity (%)', 1],
      ['Boardwalk box · Water temperature (°C)', 0],
    ]);
    expect((option.legend as { data: string[] }).data).toEqual(series.map((s) => s.name));
  });

  it('gives the lines different colours, dash patterns and symbols', () => {
    const series = setUp().option.series as Line[];
    for (const key of [(s: Line) => s.lineStyle.color, (s: Line) => JSON.stringify(s.lineStyle.type), (s: Line) => s.symbol])
      expect(new Set(series.map(key)).size).toBe(series.length);
  });

  it('plots raw readings as they are (gap markers break the line) and buckets as means at their middle', () => {
    const series = setUp().option.series as Line[];
    expect(series[0].data).toEqual([
      [T0, 1],
      [T0 + 10 * MIN, null],
      [T0 + 40 * MIN, 2],
    ]);
    expect(series[1].data).toEqual([
      [T0 + 15 * MIN, 80],
      [T0 + 45 * MIN, null],
      [T0 + 75 * MIN, 78],
      [T0 + 105 * MIN, 76],
    ]);
    expect(aggregationOf(buckets(T0, 30 * MIN, []))).toBe('mean per 30 min');
    expect(aggregationOf(buckets(T0, 6 * 3_600_000, []))).toBe('mean per 6 h');
    expect(aggregationOf(readings([], []))).toBe('raw readings');
  });

  it('names the shown zone with its offset on the time axis and spans exactly the range', () => {
    const x = setUp().option.xAxis as { name: string; min: number; max: number; axisLabel: { formatter: (v: number) => string } };
    // Europe/Berlin is UTC+02:00 from 2026-03-29 01:00 UTC (IANA tzdata), so at the middle of the range.
    expect(x.name).toBe('Europe/Berlin (UTC+02:00)');
    expect([x.min, x.max]).toEqual([RANGE.from, RANGE.to]);
    // T0 is 01:00 in Berlin, the first whole-hour tick of the two-hour range, labelled with its day
    expect(x.axisLabel.formatter(T0)).toBe('03-29 01:00');
  });

  it('puts the time axis ticks at the shown zone’s local midnights, on 23- and 25-hour days too', () => {
    const { drawn, axes } = setUp();
    const march = togetherChartOption(drawn, axes, { range: BERLIN_MARCH, zone: 'Europe/Berlin' }).xAxis as TimeAxis;
    expect(isoTicks(march)).toEqual(BERLIN_MARCH_MIDNIGHTS);
    const october = togetherChartOption(drawn, axes, { range: BERLIN_OCTOBER, zone: 'Europe/Berlin' }).xAxis as TimeAxis;
    expect(isoTicks(october)).toEqual(BERLIN_OCTOBER_MIDNIGHTS);
    expect(october.axisLabel.customValues.map(october.axisLabel.formatter)).toEqual(['2026-10-24', '10-25', '10-26', '10-27']);
  });

  it('writes the tooltip on the shown clock, each value with its line’s unit, names escaped', () => {
    const { option } = setUp([fenChannel(1, '<img src=x onerror=alert(1)>', '°C', WEIR), fenChannel(2, 'Humidity', '%', WEIR)]);
    const format = (option.tooltip as { formatter: (p: unknown) => string }).formatter;
    const html = format([
      { seriesIndex: 0, marker: '●', value: [T0 + 60 * MIN, 4.123456789], axisValue: T0 + 60 * MIN },
      { seriesIndex: 1, marker: '■', value: [T0 + 60 * MIN, null], axisValue: T0 + 60 * MIN },
    ]);
    expect(html).toBe(
      '2026-03-29 03:00:00 UTC+02:00<br/>●Weir mast · &#60;img src=x onerror=alert(1)&#62; (°C): <b>4.12346 °C</b><br/>■Weir mast · Humidity (%): <b>—</b>',
    );
  });

  it('leaves room for one legend row per line, and cuts legend names to the chart’s width', () => {
    const { option, drawn, axes } = setUp();
    const legendWidth = (width?: number) =>
      (togetherChartOption(drawn, axes, { range: RANGE, zone: 'UTC', width }).legend as { textStyle: { width: number } }).textStyle.width;
    expect([legendWidth(390), legendWidth(undefined), legendWidth(100)]).toEqual([300, 910, 120]);
    expect(togetherChartHeight(3) - togetherChartHeight(2)).toBe(20);
    expect((option.grid as { bottom: number }).bottom).toBe(3 * 20 + 96);
  });

  it('summarises each line in words', () => {
    const { drawn } = setUp();
    expect(togetherSummary(drawn, { range: RANGE, zone: 'UTC' })).toBe(
      'From 2026-03-29 00:00 to 2026-03-29 02:00 (UTC, UTC+00:00). Weir mast · Air temperature (°C): 2 readings, lowest 1 °C, highest 2 °C; ' +
        'Weir mast · Relative humidity (%): 3 points, mean per 30 min, lowest 76 %, highest 80 %; Boardwalk box · Water temperature (°C): 2 readings, lowest 3 °C, highest 4 °C.',
    );
    expect(plottedPoints(drawn[1].series)).toHaveLength(4);
  });
});
