import { describe, expect, it } from 'vitest';
import { withBands } from './readings-panel.tsx';

describe('withBands', () => {
  const option = { legend: { top: 0 }, yAxis: { type: 'value' }, series: [{ name: 'Reading', type: 'line', data: [[0, 1]] }] };

  it('adds one filled line per band on a hidden 0–1 axis and keeps the legend to the chart’s own lines', () => {
    const out = withBands(option, [{ from: 100, to: 200, label: 'Freezer warm' }]) as {
      yAxis: object[];
      series: Array<Record<string, unknown>>;
      legend: { data: string[] };
    };
    expect(out.yAxis).toEqual([{ type: 'value' }, { type: 'value', min: 0, max: 1, show: false }]);
    expect(out.series).toHaveLength(2);
    expect(out.series[1]).toMatchObject({
      name: 'Alert: Freezer warm',
      yAxisIndex: 1,
      data: [
        [100, 1],
        [200, 1],
      ],
    });
    expect(out.legend.data).toEqual(['Reading']);
  });

  it('leaves the option alone without bands', () => {
    expect(withBands(option, [])).toBe(option);
  });
});
