import type { EChartsCoreOption } from 'echarts/core';
import type { AppliedNote } from '@shared/contract/notes.ts';

/**
 * The decomposition chart with the spans of the notes left out of the analysis shaded in every
 * panel: one hidden 0–1 value axis per panel and, per note and panel, a filled line on it (the
 * line chart is the only one registered, so no extra ECharts component is needed). A note of
 * the CCF partner is not drawn (its cells were removed from the other channel).
 */
export function withLeftOutSpans(option: EChartsCoreOption, notes: readonly AppliedNote[], channelId: number): EChartsCoreOption {
  const own = notes.filter((n) => n.removedFrom === channelId);
  if (own.length === 0) return option;
  const xAxes = option.xAxis as EChartsCoreOption[];
  const yAxes = option.yAxis as EChartsCoreOption[];
  const hidden = xAxes.map((_, i) => ({ type: 'value', gridIndex: i, min: 0, max: 1, show: false }));
  const shaded = own.flatMap((n) =>
    xAxes.map((_, i) => ({
      name: `Left out: ${n.kind}`,
      type: 'line',
      xAxisIndex: i,
      yAxisIndex: yAxes.length + i,
      data: [
        [n.from, 1],
        [n.to, 1],
      ],
      showSymbol: false,
      lineStyle: { width: 0 },
      areaStyle: { color: 'rgba(63, 84, 120, 0.16)' },
      tooltip: { show: false },
      silent: true,
      z: 0,
    })),
  );
  return { ...option, yAxis: [...yAxes, ...hidden], series: [...(option.series as EChartsCoreOption[]), ...shaded] };
}
