import { describe, expect, it } from 'vitest';
import type { EChartsCoreOption } from 'echarts/core';
import { noteSpansSummary, withNoteSpans } from './readings-chart-option.ts';

/** The fields of a shaded note series these tests read. */
interface SpanSeries {
  name: string;
  yAxisIndex: number;
  data: [{ value: number[]; label: Record<string, unknown> }, number[]];
  areaStyle: { color: string };
}

const base = (): EChartsCoreOption => ({ legend: { top: 0 }, yAxis: { type: 'value' }, series: [{ name: 'Reading', type: 'line', data: [] }] });
const range = { from: 1000, to: 101_000 };

describe('withNoteSpans', () => {
  it('adds one shaded span per note on a hidden 0–1 axis, clipped to the range, with its words at the start', () => {
    const out = withNoteSpans(base(), [{ from: 0, to: 11_000, label: 'maintenance: Probe cleaned', excluded: true }], range);
    const series = out.series as SpanSeries[];
    expect(series).toHaveLength(2);
    const span = series[1];
    expect(span.name).toBe('Note: maintenance: Probe cleaned');
    expect(span.yAxisIndex).toBe(1);
    expect(span.data[0].value).toEqual([1000, 1]);
    expect(span.data[0].label).toMatchObject({ show: true, formatter: 'maintenance: Probe cleaned' });
    expect(span.data[1]).toEqual([11_000, 1]);
    expect(span.areaStyle.color).toBe('rgba(63, 84, 120, 0.22)');
    expect((out.yAxis as unknown[])[1]).toEqual({ type: 'value', min: 0, max: 1, show: false });
    expect((out.legend as { data: string[] }).data).toEqual(['Reading']);
  });

  it('leaves the option alone when no note overlaps the range; a note kept in analysis is shaded lighter', () => {
    const option = base();
    expect(withNoteSpans(option, [{ from: 200_000, to: 300_000, label: 'later', excluded: false }], range)).toBe(option);
    const out = withNoteSpans(option, [{ from: 5000, to: 6000, label: 'x', excluded: false }], range);
    expect((out.series as SpanSeries[])[1].areaStyle.color).toBe('rgba(63, 84, 120, 0.1)');
  });

  it('names the shaded notes in the caption, and only those in the range', () => {
    const spans = [
      { from: 5000, to: 6000, label: 'maintenance: Probe cleaned', excluded: true },
      { from: 500_000, to: 600_000, label: 'later', excluded: false },
    ];
    expect(noteSpansSummary(spans, range)).toBe(' Shaded: 1 note (maintenance: Probe cleaned).');
    expect(noteSpansSummary([], range)).toBe('');
  });
});
