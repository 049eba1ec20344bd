import type { EChartsCoreOption } from 'echarts/core';
import { formatZoned, zoneOffsetLabel } from '../../../components/clock/format.ts';
import type { Series, TimeRange } from '@shared/contract/channels.ts';
import type { AxisPlan, PlannedLine } from './together-lines.ts';
import { zoomSlider } from '../../../components/charts/zoom-slider.ts';
import { timeLabel, zonedTimeAxis } from '../../../components/charts/time-axis.ts';

/** A planned line with the series fetched for it. */
export interface DrawnLine extends PlannedLine {
  series: Series;
}

/** The time and zone the chart is drawn for, and how wide it is drawn. */
export interface TogetherContext {
  range: TimeRange;
  zone: string;
  /** The chart's width in px when known: legend names longer than the width are cut with an ellipsis. */
  width?: number;
}

type Point = [number, number | null];

const INK = '#1b2624';
const INK_SOFT = '#4a5a56';
const RULE = '#d9d4c5';
const LEGEND_ROW = 20;

/**
 * The points a line draws, and the only place they are made, so the CSV holds exactly what is
 * plotted: raw readings as they are (a null value is the server's gap marker, where the line
 * breaks), or for a downsampled series each bucket's mean at the bucket's middle (whole ms).
 * The min–max envelope of the single-channel chart is left out: six envelopes would hide each other.
 */
export function plottedPoints(series: Series): Point[] {
  if (series.shape === 'readings') return series.t.map((t, i): Point => [t, series.value[i]]);
  const half = Math.floor(series.bucketMs / 2);
  return series.t.map((t, i): Point => [t + half, series.mean[i]]);
}

/** What a line's points are, in words: `raw readings` or `mean per 30 min`. */
export function aggregationOf(series: Series): string {
  if (series.shape === 'readings') return 'raw readings';
  const min = series.bucketMs / 60_000;
  return min >= 120 && min % 60 === 0 ? `mean per ${min / 60} h` : `mean per ${Number(min.toPrecision(4))} min`;
}

/** Pixel height of the chart for `lines` lines: the plot plus one legend row per line. */
export function togetherChartHeight(lineCount: number): number {
  return 330 + lineCount * LEGEND_ROW;
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (ch) => `&#${ch.charCodeAt(0)};`);
const fmt = (v: number) => String(Number(v.toPrecision(6)));

/**
 * The ECharts option of several channels on one time axis: one value axis per unit (from
 * `planLines`: the first on the left, further ones on the right), each line in its own colour,
 * dash pattern and symbol, the legend below the zoom slider one line per row (so it never runs
 * into the plot on a narrow screen and is part of the PNG), the time axis, slider and tooltip on
 * the clock of `ctx.zone`. The tooltip is HTML, so channel and logger names are escaped.
 * Animation is off, so the `finished` event follows the first frame.
 */
export function togetherChartOption(lines: readonly DrawnLine[], axes: readonly AxisPlan[], ctx: TogetherContext): EChartsCoreOption {
  const tz = ctx.zone;
  const legendHeight = lines.length * LEGEND_ROW;
  const right = axes.filter((a) => a.position === 'right');
  const units = lines.map((l) => axes[l.axis].unit);
  return {
    animation: false,
    textStyle: { fontFamily: 'Figtree Variable, system-ui, sans-serif', color: INK },
    grid: { left: 52, right: right.length === 0 ? 20 : right.length === 1 ? 52 : 116, top: 30, bottom: legendHeight + 96 },
    legend: {
      orient: 'vertical',
      left: 8,
      bottom: 4,
      itemGap: LEGEND_ROW - 14,
      itemHeight: 14,
      itemWidth: 36,
      textStyle: { color: INK, overflow: 'truncate', width: Math.max(120, (ctx.width ?? 1000) - 90) },
      data: lines.map((l) => l.name),
    },
    tooltip: {
      trigger: 'axis',
      formatter: (params: unknown) => {
        const items = (Array.isArray(params) ? params : [params]) as Array<{ seriesIndex: number; marker: string; value: Point; axisValue: number }>;
        if (items.length === 0) return '';
        const at = Number(items[0].axisValue);
        const head = `${escapeHtml(formatZoned(at, tz, { seconds: true }))} ${escapeHtml(zoneOffsetLabel(at, tz))}`;
        const rows = items.map((p) => {
          const v = p.value?.[1];
          const unit = units[p.seriesIndex];
          return `${p.marker}${escapeHtml(lines[p.seriesIndex].name)}: <b>${typeof v === 'number' ? escapeHtml(`${fmt(v)}${unit ? ` ${unit}` : ''}`) : '—'}</b>`;
        });
        return [head, ...rows].join('<br/>');
      },
      axisPointer: { label: { formatter: (p: { value: unknown }) => `${formatZoned(Number(p.value), tz)} ${zoneOffsetLabel(Number(p.value), tz)}` } },
    },
    xAxis: {
      type: 'time',
      min: ctx.range.from,
      max: ctx.range.to,
      name: `${tz} (${zoneOffsetLabel((ctx.range.from + ctx.range.to) / 2, tz)})`,
      nameLocation: 'middle',
      nameGap: 32,
      ...zonedTimeAxis(ctx.range.from, ctx.range.to, tz, { lineHeight: 14 }),
    },
    yAxis: axes.map((a) => ({
      type: 'value',
      scale: true,
      name: a.name,
      position: a.position,
      offset: a.offset,
      alignTicks: axes.length > 1,
      nameTextStyle: { color: INK_SOFT, align: a.position === 'left' ? 'left' : 'right' },
      axisLine: { show: true, lineStyle: { color: INK_SOFT } },
      axisLabel: { color: INK_SOFT, hideOverlap: true },
      splitLine: { show: a === axes[0], lineStyle: { color: RULE } },
    })),
    dataZoom: [{ type: 'inside', xAxisIndex: 0, filterMode: 'none' }, zoomSlider(legendHeight + 14, (v: number) => timeLabel(v, tz))],
    series: lines.map((l) => {
      const data = plottedPoints(l.series);
      return {
        name: l.name,
        type: 'line',
        yAxisIndex: l.axis,
        data,
        connectNulls: false,
        symbol: l.look.symbol,
        symbolSize: 6,
        showSymbol: data.length <= 60,
        lineStyle: { color: l.look.color, width: 1.75, type: l.look.dash },
        itemStyle: { color: l.look.color },
      };
    }),
  };
}

/** The chart's content in words: each line with how many points it draws and their extremes, and the span and zone. */
export function togetherSummary(lines: readonly DrawnLine[], ctx: TogetherContext): string {
  const tz = ctx.zone;
  const span = `From ${formatZoned(ctx.range.from, tz)} to ${formatZoned(ctx.range.to, tz)} (${tz}, ${zoneOffsetLabel(ctx.range.to, tz)}).`;
  const parts = lines.map((l) => {
    const values = plottedPoints(l.series)
      .map((p) => p[1])
      .filter((v): v is number => v !== null);
    if (values.length === 0) return `${l.name}: no readings`;
    let lo = values[0];
    let hi = values[0];
    for (const v of values) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    const unit = l.channel.unit?.trim() ? ` ${l.channel.unit.trim()}` : '';
    const what = l.series.shape === 'readings' ? 'readings' : `points, ${aggregationOf(l.series)}`;
    return `${l.name}: ${values.length} ${what}, lowest ${fmt(lo)}${unit}, highest ${fmt(hi)}${unit}`;
  });
  return `${span} ${parts.join('; ')}.`;
}
