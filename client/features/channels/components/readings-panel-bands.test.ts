import { describe, expect, it } from 'vitest';
import { ALERT_EDGE, withBands } from './readings-panel.tsx';

describe('withBands', () => {
  // a chart over 0–10 000 ms: the least band width is 1/100 of that, 100 ms
  const option = {
    legend: { top: 0 },
    xAxis: { type: 'time', min: 0, max: 10_000 },
    yAxis: { type: 'value' },
    series: [{ name: 'Reading', type: 'line', data: [[0, 1]] }],
  };
  type Out = { yAxis: object[]; series: Array<Record<string, unknown> & { data: number[][] }>; legend: { data: string[] } };

  it('adds one outlined box per band on a hidden 0–1 axis and keeps the legend to the chart’s own lines', () => {
    const out = withBands(option, [{ from: 1000, to: 2000, label: 'Freezer warm' }]) as Out;
    expect(out.yAxis).toEqual([{ type: 'value' }, { type: 'value', min: 0, max: 1, show: false }]);
    expect(out.series).toHaveLength(2);
    expect(out.series[1]).toMatchObject({
      name: 'Alert: Freezer warm',
      yAxisIndex: 1,
      // a closed box: up the left edge, along the top, down the right edge
      data: [
        [1000, 0],
        [1000, 1],
        [2000, 1],
        [2000, 0],
      ],
      lineStyle: { width: 1.5, color: ALERT_EDGE },
    });
    expect(out.legend.data).toEqual(['Reading']);
  });

  it('widens a short alert around its middle to 1/100 of the range, and keeps it inside the range', () => {
    const short = withBands(option, [{ from: 5000, to: 5002, label: 'Blip' }]) as Out;
    expect(short.series[1].data).toEqual([
      [4951, 0],
      [4951, 1],
      [5051, 1],
      [5051, 0],
    ]);
    const atEnd = withBands(option, [{ from: 9999, to: 10_000, label: 'Late' }]) as Out;
    expect(atEnd.series[1].data.map((p) => p[0])).toEqual([9900, 9900, 10_000, 10_000]);
    const atStart = withBands(option, [{ from: 0, to: 0, label: 'Early' }]) as Out;
    expect(atStart.series[1].data.map((p) => p[0])).toEqual([0, 0, 100, 100]);
  });

  it('leaves the option alone without bands', () => {
    expect(withBands(option, [])).toBe(option);
  });
});
