import { describe, expect, it } from 'vitest';
import type { EChartsCoreOption } from 'echarts/core';
import type { AppliedNote } from '@shared/contract/notes.ts';
import { withLeftOutSpans } from './left-out-spans.ts';

const two = (): EChartsCoreOption => ({
  xAxis: [
    { type: 'time', gridIndex: 0 },
    { type: 'time', gridIndex: 1 },
  ],
  yAxis: [
    { type: 'value', gridIndex: 0 },
    { type: 'value', gridIndex: 1 },
  ],
  series: [{ name: 'observed' }, { name: 'trend' }],
});
const note = (over: Partial<AppliedNote>): AppliedNote => ({
  id: 1,
  kind: 'maintenance',
  text: 'Probe cleaned',
  channelId: 5,
  removedFrom: 5,
  from: 1000,
  to: 4000,
  cellsRemoved: 3,
  ...over,
});

describe('withLeftOutSpans', () => {
  it('shades a left-out note in every panel, each on a hidden 0–1 axis of that panel', () => {
    const out = withLeftOutSpans(two(), [note({})], 5);
    const yAxes = out.yAxis as Array<Record<string, unknown>>;
    expect(yAxes.slice(2)).toEqual([
      { type: 'value', gridIndex: 0, min: 0, max: 1, show: false },
      { type: 'value', gridIndex: 1, min: 0, max: 1, show: false },
    ]);
    const series = (out.series as Array<Record<string, unknown>>).slice(2);
    expect(series.map((s) => [s.xAxisIndex, s.yAxisIndex, s.data])).toEqual([
      [
        0,
        2,
        [
          [1000, 1],
          [4000, 1],
        ],
      ],
      [
        1,
        3,
        [
          [1000, 1],
          [4000, 1],
        ],
      ],
    ]);
  });

  it('draws nothing for the partner’s notes or when no note applies', () => {
    const option = two();
    expect(withLeftOutSpans(option, [note({ removedFrom: 6 })], 5)).toBe(option);
    expect(withLeftOutSpans(option, [], 5)).toBe(option);
  });
});
