import type { EChartsCoreOption } from 'echarts/core';
import { formatZoned } from '../../../components/clock/format.ts';
import { zonedTimeAxis } from '../../../components/charts/time-axis.ts';
import type { Decomposition } from '@shared/contract/diagnostics.ts';

type Parts = Extract<Decomposition, { trend: unknown }>;

const PANELS = ['Observed', 'Trend', 'Seasonal', 'Remainder'] as const;

/** The grid cell of each value of the parts: `d.cells` when thinned for drawing, else 0, 1, 2 … */
export function cellsOfParts(d: Parts): number[] {
  return d.cells ?? d.trend.map((_, i) => i);
}

/**
 * The observed grid value of each cell as trend + seasonal + remainder (the decomposition's
 * identity; Cleveland et al. 1990 eq. 1), left missing where a part is missing or the cell held
 * no reading (`emptyCells`: STL filled it by interpolation, which the observed panel must not pass
 * off as a reading).
 */
export function observedFromParts(d: Parts, emptyCells: readonly number[]): Array<number | null> {
  const empty = new Set(emptyCells);
  const cells = cellsOfParts(d);
  return d.trend.map((t, j) => {
    const s = d.seasonal[j];
    const r = d.remainder[j];
    return empty.has(cells[j]) || t === null || s === null || r === null ? null : t + s + r;
  });
}

/**
 * The observed panel's values: the grid values as the server sent them (whole, also where the
 * classical trend is undefined at the ends), or, from a server that sent no `observed`, the sum
 * of the parts.
 */
export function observedOf(d: Parts, emptyCells: readonly number[]): Array<number | null> {
  return d.observed ?? observedFromParts(d, emptyCells);
}

/**
 * Four stacked panels sharing one time axis on the logger's clock: observed, trend, seasonal
 * and remainder, with the remainder's outliers as red diamonds. A decomposition thinned for
 * drawing is drawn at its kept cells (their times come from `d.cells`). Animation is off.
 */
export function decompositionChartOption(d: Parts, grid: { start: number; stepMs: number; emptyCells: number[] }, timezone: string): EChartsCoreOption {
  const times = cellsOfParts(d).map((i) => grid.start + i * grid.stepMs);
  const columns = [observedOf(d, grid.emptyCells), d.trend, d.seasonal, d.remainder];
  const panelHeight = 18; // percent of the chart per panel
  const grids = PANELS.map((_, i) => ({ left: 64, right: 16, top: `${4 + i * (panelHeight + 5.5)}%`, height: `${panelHeight}%` }));
  return {
    animation: false,
    textStyle: { fontFamily: 'Figtree Variable, system-ui, sans-serif', color: '#1b2624' },
    axisPointer: { link: [{ xAxisIndex: 'all' }] },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (v: unknown) => (typeof v === 'number' ? Number(v.toPrecision(5)).toString() : '—'),
      axisPointer: { label: { formatter: (p: { value: unknown }) => formatZoned(Number(p.value), timezone) } },
    },
    grid: grids,
    xAxis: PANELS.map((_, i) => ({
      type: 'time',
      gridIndex: i,
      min: times[0],
      max: times[times.length - 1],
      ...zonedTimeAxis(times[0], times[times.length - 1], timezone, { show: i === PANELS.length - 1 }),
    })),
    yAxis: PANELS.map((name, i) => ({ type: 'value', gridIndex: i, scale: true, name, nameLocation: 'middle', nameGap: 48, splitNumber: 2 })),
    series: [
      ...PANELS.map((name, i) => ({
        name,
        type: 'line',
        xAxisIndex: i,
        yAxisIndex: i,
        showSymbol: false,
        connectNulls: false,
        data: times.map((t, k) => [t, columns[i][k]]),
        lineStyle: { width: 1.2, color: i === 0 ? '#1b2624' : '#2f6f5e' },
        itemStyle: { color: i === 0 ? '#1b2624' : '#2f6f5e' },
      })),
      {
        name: 'Remainder outlier',
        type: 'scatter',
        xAxisIndex: 3,
        yAxisIndex: 3,
        symbol: 'diamond',
        symbolSize: 8,
        itemStyle: { color: '#b23a2a' },
        data: d.outliers.times.map((t, k) => [t, d.outliers.values[k]]),
      },
    ],
  };
}
