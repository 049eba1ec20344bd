import type { EChartsCoreOption } from 'echarts/core';
import { formatZoned, zoneOffsetLabel } from '../../../components/clock/format.ts';
import type { Series, TimeRange } from '@shared/contract/channels.ts';
import { zoomSlider } from '../../../components/charts/zoom-slider.ts';
import { timeLabel, zonedTimeAxis } from '../../../components/charts/time-axis.ts';

/** What the readings chart needs to know about its channel. */
export interface ReadingsChartContext {
  label: string;
  unit: string | null;
  timezone: string;
  validMin: number | null;
  validMax: number | null;
  range: TimeRange;
}

const INK = '#1b2624';
const LICHEN = '#2f6f5e';
const ENVELOPE = '#8fb3a8';
const ALERT = '#b23a2a';
const AMBER = '#c98d1c';

type Point = [number, number | null];

const UNIT_WORDS: Array<[number, string, string | null]> = [
  [86_400_000, 'day', 'daily'],
  [3_600_000, 'hour', 'hourly'],
  [60_000, 'minute', null],
  [1_000, 'second', null],
];

/**
 * The size of a chart cell in plain words for legends and captions: "10-minute", "hourly",
 * "daily", "2-hour", "30-second"; a size that is no whole number of seconds falls back to
 * whole milliseconds ("250-millisecond").
 */
export function cellSizeWords(ms: number): string {
  for (const [size, unit, single] of UNIT_WORDS) {
    if (ms >= size && ms % size === 0) {
      const n = ms / size;
      return n === 1 && single ? single : `${n}-${unit}`;
    }
  }
  return `${Math.round(ms)}-millisecond`;
}

const isOutside = (v: number, min: number | null, max: number | null) => (min !== null && v < min) || (max !== null && v > max);

/** Points (time, value) of the series that lie outside the valid range; for summarised cells, their extremes. */
export function outOfRangePoints(series: Series, validMin: number | null, validMax: number | null): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  if (validMin === null && validMax === null) return out;
  if (series.shape === 'readings') {
    series.t.forEach((t, i) => {
      const v = series.value[i];
      if (v !== null && isOutside(v, validMin, validMax)) out.push([t, v]);
    });
  } else {
    series.t.forEach((t, i) => {
      const lo = series.min[i];
      const hi = series.max[i];
      const mid = t + series.bucketMs / 2;
      if (hi !== null && validMax !== null && hi > validMax) out.push([mid, hi]);
      if (lo !== null && validMin !== null && lo < validMin) out.push([mid, lo]);
    });
  }
  return out;
}

/** Every value the chart draws: the readings, or each cell's minimum and maximum (gaps left out). */
const plottedValues = (series: Series): number[] =>
  (series.shape === 'readings' ? series.value : [...series.min, ...series.max]).filter((v): v is number => v !== null);

/**
 * Whether a limit lies within the plotted values' extent widened by a quarter on each side: the
 * value axis fits the data (not the limits), so a limit far from every reading is not drawn and
 * needs no room for its label.
 */
function nearData(series: Series, limit: number): boolean {
  const values = plottedValues(series);
  if (values.length === 0) return false;
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const pad = Math.max((hi - lo) / 4, Math.abs(hi) * 0.01);
  return limit >= lo - pad && limit <= hi + pad;
}

/** Pixels kept right of the plot for the valid-limit labels ("valid maximum" over "60 °C"). */
export const LIMIT_LABEL_ROOM = 104;

/**
 * The label of a valid-limit line: written past the line's right end, in the margin right of the
 * plot (markers and lines are clipped to the plot, so none can hide it), on the card's colour
 * with a thin amber rule, the limit's name over its value and unit.
 */
export function limitLabel(unit: string) {
  return {
    position: 'end',
    distance: 6,
    formatter: (p: { name: string; value: unknown }) => `${p.name}\n${typeof p.value === 'number' ? Number(p.value.toPrecision(6)) : String(p.value)}${unit}`,
    color: INK,
    fontSize: 11,
    lineHeight: 14,
    backgroundColor: '#fffdf8',
    borderColor: AMBER,
    borderWidth: 1,
    borderRadius: 3,
    padding: [2, 4],
  };
}

/** A test reading as the chart draws it: sent by hand, kept apart from the channel's readings. */
export interface TestReadingPoint {
  ts: number;
  value: number;
}

const TEST_INK = '#6b3fa0';

/**
 * The chart option with the channel's test readings added as their own series: hollow diamonds
 * with a purple outline, never joined to the readings' line, named "Test reading" in the legend
 * and tooltip. A test value far outside what the chart shows (beyond the readings' extent and
 * valid limits widened by half their span on each side) would squash the readings into a flat
 * line, so it is drawn at the edge as "Test reading (off the scale)" with its value written beside it.
 */
export function withTestReadings(option: EChartsCoreOption, points: readonly TestReadingPoint[], series: Series, ctx: ReadingsChartContext): EChartsCoreOption {
  const shown = points.filter((p) => p.ts >= ctx.range.from && p.ts < ctx.range.to);
  if (shown.length === 0) return option;
  const regular = plottedValues(series);
  const bounds = [...regular, ...(ctx.validMin !== null ? [ctx.validMin] : []), ...(ctx.validMax !== null ? [ctx.validMax] : [])];
  const lo = Math.min(...bounds);
  const hi = Math.max(...bounds);
  const pad = bounds.length > 0 ? Math.max((hi - lo) / 2, Math.abs(hi) * 0.1, 1) : Infinity;
  const onScale = shown.filter((p) => p.value >= lo - pad && p.value <= hi + pad);
  const offScale = shown.filter((p) => p.value < lo - pad || p.value > hi + pad);
  const marker = { symbol: 'diamond', symbolSize: 11, itemStyle: { color: '#ffffff', borderColor: TEST_INK, borderWidth: 2 }, z: 6 };
  const added: EChartsCoreOption[] = [];
  if (onScale.length) added.push({ name: 'Test reading', type: 'scatter', data: onScale.map((p) => [p.ts, p.value]), ...marker });
  if (offScale.length) {
    added.push({
      name: 'Test reading (off the scale)',
      type: 'scatter',
      data: offScale.map((p) => ({
        value: [p.ts, p.value < lo ? lo - pad : hi + pad],
        label: { show: true, formatter: `test ${p.value}`, position: 'left', color: TEST_INK },
      })),
      ...marker,
      itemStyle: { ...marker.itemStyle, borderType: 'dashed' },
    });
  }
  return { ...option, series: [...(option.series as EChartsCoreOption[]), ...added] };
}

/** The test readings of the chart in words, appended to its summary ('' when there are none). */
export function testReadingsSummary(points: readonly TestReadingPoint[], ctx: ReadingsChartContext): string {
  const shown = points.filter((p) => p.ts >= ctx.range.from && p.ts < ctx.range.to);
  if (shown.length === 0) return '';
  const unit = ctx.unit ? ` ${ctx.unit}` : '';
  const values = shown.map((p) => `${Number(p.value.toPrecision(6))}${unit}`).join(', ');
  return ` ${shown.length} test ${shown.length === 1 ? 'reading' : 'readings'} (${values}) drawn apart as hollow diamonds: not among the readings, left out of diagnostics and alerts.`;
}

/**
 * The ECharts option of a channel's readings over its range: a line broken at gaps (raw
 * readings, or each cell's mean with the cell's minimum and maximum drawn as an envelope when
 * the series is summarised; the legend names the cell size, e.g. "10-minute mean"), the valid minimum and maximum as dashed lines, readings outside
 * them as triangles, the time axis and tooltip on the logger's clock with its UTC offset, and
 * zoom (mouse wheel, drag, and a slider) whose window the page turns into a new request.
 * Animation is off, so the `finished` event follows the first frame.
 */
export function readingsChartOption(series: Series, ctx: ReadingsChartContext): EChartsCoreOption {
  const tz = ctx.timezone;
  const unit = ctx.unit ? ` ${ctx.unit}` : '';
  const midOffset = zoneOffsetLabel((ctx.range.from + ctx.range.to) / 2, tz);
  const lines: EChartsCoreOption[] = [];
  if (series.shape === 'readings') {
    lines.push({
      name: 'Reading',
      type: 'line',
      data: series.t.map((t, i): Point => [t, series.value[i]]),
      showSymbol: series.t.length < 200,
      symbolSize: 4,
      connectNulls: false,
      lineStyle: { color: LICHEN, width: 1.5 },
      itemStyle: { color: LICHEN },
    });
  } else {
    const words = cellSizeWords(series.bucketMs);
    const size = words.charAt(0).toUpperCase() + words.slice(1);
    const at = (arr: Array<number | null>) => series.t.map((t, i): Point => [t + series.bucketMs / 2, arr[i]]);
    lines.push(
      {
        name: `${size} maximum`,
        type: 'line',
        data: at(series.max),
        showSymbol: false,
        connectNulls: false,
        lineStyle: { color: ENVELOPE, width: 1 },
        itemStyle: { color: ENVELOPE },
      },
      {
        name: `${size} minimum`,
        type: 'line',
        data: at(series.min),
        showSymbol: false,
        connectNulls: false,
        lineStyle: { color: ENVELOPE, width: 1 },
        itemStyle: { color: ENVELOPE },
      },
      {
        name: `${size} mean`,
        type: 'line',
        data: at(series.mean),
        showSymbol: false,
        connectNulls: false,
        lineStyle: { color: LICHEN, width: 1.5 },
        itemStyle: { color: LICHEN },
      },
    );
  }
  const limits = [
    ...(ctx.validMin !== null ? [{ yAxis: ctx.validMin, name: 'valid minimum' }] : []),
    ...(ctx.validMax !== null ? [{ yAxis: ctx.validMax, name: 'valid maximum' }] : []),
  ];
  if (limits.length > 0) {
    lines[lines.length - 1] = {
      ...lines[lines.length - 1],
      markLine: {
        silent: true,
        symbol: 'none',
        lineStyle: { color: AMBER, type: 'dashed' },
        label: limitLabel(unit),
        data: limits,
      },
    };
  }
  const outside = outOfRangePoints(series, ctx.validMin, ctx.validMax);
  const scatter = outside.length
    ? [{ name: 'Outside the valid range', type: 'scatter', data: outside, symbol: 'triangle', symbolSize: 9, itemStyle: { color: ALERT }, z: 5 }]
    : [];
  return {
    animation: false,
    textStyle: { fontFamily: 'Figtree Variable, system-ui, sans-serif', color: INK },
    legend: { top: 0, right: 0 },
    // with a limit near the data, the right margin holds its label outside the plot, clear of the markers
    grid: { left: 56, right: limits.some((l) => nearData(series, l.yAxis)) ? LIMIT_LABEL_ROOM : 24, top: 36, bottom: 84 },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (v: unknown) => (typeof v === 'number' ? `${Number(v.toPrecision(6))}${unit}` : '—'),
      axisPointer: {
        label: { formatter: (p: { value: unknown }) => `${formatZoned(Number(p.value), tz, { seconds: true })} ${zoneOffsetLabel(Number(p.value), tz)}` },
      },
    },
    xAxis: {
      type: 'time',
      min: ctx.range.from,
      max: ctx.range.to,
      name: `${tz} (${midOffset})`,
      nameLocation: 'middle',
      nameGap: 30,
      ...zonedTimeAxis(ctx.range.from, ctx.range.to, tz),
    },
    yAxis: { type: 'value', scale: true, name: ctx.unit ?? '', nameTextStyle: { align: 'left' } },
    dataZoom: [{ type: 'inside', xAxisIndex: 0, filterMode: 'none' }, zoomSlider(8, (v: number) => timeLabel(v, tz))],
    series: [...lines, ...scatter],
  };
}

/** The chart's content in words: how many points, the extremes and how many lie outside the valid range. */
export function readingsSummary(series: Series, ctx: ReadingsChartContext): string {
  const tz = ctx.timezone;
  const values = plottedValues(series);
  const span = `from ${formatZoned(ctx.range.from, tz)} to ${formatZoned(ctx.range.to, tz)} (${tz}, ${zoneOffsetLabel(ctx.range.to, tz)})`;
  if (values.length === 0) return `No readings ${span}.`;
  const unit = ctx.unit ? ` ${ctx.unit}` : '';
  const what =
    series.shape === 'readings'
      ? `${series.value.filter((v) => v !== null).length} readings`
      : `${series.t.length} points (each the mean of a ${cellSizeWords(series.bucketMs)} cell, with the cell’s lowest and highest reading as thin lines above and below; ${series.source === 'rollup' ? 'read from stored summaries' : 'worked out from the readings'})`;
  const outside = outOfRangePoints(series, ctx.validMin, ctx.validMax).length;
  const fmt = (v: number) => Number(v.toPrecision(6));
  return `${what} ${span}; lowest ${fmt(Math.min(...values))}${unit}, highest ${fmt(Math.max(...values))}${unit}${outside ? `; ${outside} outside the valid range` : ''}.`;
}

/** A noted stretch of time to shade on the readings chart, with the note's words. */
export interface NoteSpan {
  from: number;
  to: number;
  /** Kind and text, shown at the span's top left. */
  label: string;
  /** Marked "leave out of analysis": drawn a shade darker. */
  excluded: boolean;
}

const NOTE_INK = '#3f5478';

/**
 * The chart option with each note shaded over the full height and its words written at its
 * top left: a filled line on a hidden 0–1 axis per note (the line chart is the only one
 * registered, so no extra ECharts component is needed), clipped to the chart's range.
 */
export function withNoteSpans(option: EChartsCoreOption, spans: readonly NoteSpan[], range: TimeRange): EChartsCoreOption {
  const shown = spans.filter((s) => s.to > range.from && s.from < range.to);
  if (shown.length === 0) return option;
  const yAxes = (Array.isArray(option.yAxis) ? option.yAxis : [option.yAxis]) as EChartsCoreOption[];
  const series = option.series as EChartsCoreOption[];
  const shaded = shown.map((s) => {
    const from = Math.max(s.from, range.from);
    // at least 1/150 of the range wide, so a half-hour cleaning stays visible on a week
    const to = Math.max(Math.min(s.to, range.to), from + (range.to - range.from) / 150);
    return {
      name: `Note: ${s.label}`,
      type: 'line',
      yAxisIndex: yAxes.length,
      data: [{ value: [from, 1], label: { show: true, formatter: s.label.length > 48 ? `${s.label.slice(0, 47)}…` : s.label, position: 'right' } }, [to, 1]],
      // a line series draws data labels on its symbols: a small mark at the span's top left carries the words
      showSymbol: true,
      symbol: 'circle',
      symbolSize: 3,
      label: { color: NOTE_INK, fontSize: 11, offset: [2, 10] },
      lineStyle: { width: 0 },
      itemStyle: { color: NOTE_INK },
      areaStyle: { color: s.excluded ? 'rgba(63, 84, 120, 0.22)' : 'rgba(63, 84, 120, 0.1)' },
      tooltip: { show: false },
      silent: true,
      z: 0,
    };
  });
  // the legend keeps naming only the chart's own lines (alert bands may have set that list already)
  const own = option.legend as (EChartsCoreOption & { data?: unknown[] }) | undefined;
  const legend = own ? { ...own, data: own.data ?? series.map((s) => s.name).filter(Boolean) } : undefined;
  return { ...option, ...(legend ? { legend } : {}), yAxis: [...yAxes, { type: 'value', min: 0, max: 1, show: false }], series: [...series, ...shaded] };
}

/** The notes shaded on the chart, in words for the figure's caption (empty when none falls in the range). */
export function noteSpansSummary(spans: readonly NoteSpan[], range: TimeRange): string {
  const shown = spans.filter((s) => s.to > range.from && s.from < range.to);
  if (shown.length === 0) return '';
  return ` Shaded: ${shown.length} note${shown.length === 1 ? '' : 's'} (${shown.map((s) => s.label).join('; ')}).`;
}

/** One projected step of an early warning (as the server stores it with the alert). */
export interface ProjectedStep {
  at: number;
  mean: number;
  lower: number;
  upper: number;
}

/** An open early warning's projection as the chart draws it. */
export interface ChartProjection {
  model: string;
  limit: number;
  side: 'high' | 'low';
  horizonMin: number;
  chance: number;
  interval: { level: number; lower: number; upper: number };
  from: number;
  /** The projected course step by step; when the answer carries none, the interval at the horizon alone is drawn. */
  path?: readonly ProjectedStep[];
}

const PROJECTION_INK = '#7a4f9a';
const PROJECTION_FILL = 'rgba(122, 79, 154, 0.18)';

/** The projection's steps, or the interval at the horizon alone when the answer has no path. */
function projectedSteps(p: ChartProjection): ProjectedStep[] {
  if (p.path && p.path.length > 0) return [...p.path];
  const at = p.from + p.horizonMin * 60_000;
  return [{ at, lower: p.interval.lower, upper: p.interval.upper, mean: (p.interval.lower + p.interval.upper) / 2 }];
}

/**
 * The chart option with an open early warning's projection: its central course as a dashed
 * line ("Projected course"), the central interval as a shaded band (a stacked pair: an unnamed
 * invisible lower edge, then the band's width above it), and the rule's limit as a dash-dotted line named with
 * its value, each named in the legend so the look is not the only cue. The time axis is widened
 * to the projection's end, so the look-ahead shows to the right of the newest reading. A
 * projection that starts outside the chart's range is left out.
 */
export function withProjection(option: EChartsCoreOption, projection: ChartProjection | null, ctx: ReadingsChartContext): EChartsCoreOption {
  if (!projection || projection.from < ctx.range.from || projection.from > ctx.range.to) return option;
  const steps = projectedSteps(projection);
  const unit = ctx.unit ? ` ${ctx.unit}` : '';
  const level = Math.round(projection.interval.level * 100);
  const end = steps[steps.length - 1].at;
  const axis = option.xAxis as EChartsCoreOption & { max?: number };
  const added: EChartsCoreOption[] = [
    {
      // unnamed: the legend (which later steps rebuild from the series' names) lists only the band itself
      type: 'line',
      stack: 'projection-band',
      data: steps.map((s) => [s.at, s.lower]),
      showSymbol: false,
      lineStyle: { opacity: 0 },
      tooltip: { show: false },
      silent: true,
      z: 2,
    },
    {
      name: `${level} % projection band`,
      type: 'line',
      stack: 'projection-band',
      data: steps.map((s) => [s.at, s.upper - s.lower]),
      showSymbol: false,
      lineStyle: { opacity: 0 },
      itemStyle: { color: PROJECTION_FILL },
      areaStyle: { color: PROJECTION_FILL, opacity: 1 },
      tooltip: { show: false },
      silent: true,
      z: 2,
    },
    {
      name: 'Projected course',
      type: 'line',
      data: steps.map((s) => [s.at, s.mean]),
      showSymbol: false,
      lineStyle: { color: PROJECTION_INK, type: 'dashed', width: 2 },
      itemStyle: { color: PROJECTION_INK },
      markLine: {
        silent: true,
        symbol: 'none',
        lineStyle: { color: ALERT, type: 'dashdot' },
        label: { formatter: `limit ${Number(projection.limit.toPrecision(6))}${unit}`, position: 'insideEndTop', color: ALERT },
        data: [{ yAxis: projection.limit, name: 'rule limit' }],
      },
      z: 4,
    },
  ];
  const series = option.series as EChartsCoreOption[];
  const own = option.legend as (EChartsCoreOption & { data?: unknown[] }) | undefined;
  const names = (own?.data as string[] | undefined) ?? series.map((s) => s.name as string).filter(Boolean);
  const legend = own ? { ...own, data: [...names, 'Projected course', `${level} % projection band`] } : undefined;
  return {
    ...option,
    ...(legend ? { legend } : {}),
    xAxis: { ...axis, max: Math.max(typeof axis?.max === 'number' ? axis.max : end, end) },
    series: [...series, ...added],
  };
}

/** The projection drawn on the chart, in words for the figure's caption ('' when none is drawn). */
export function projectionSummary(projection: ChartProjection | null, ctx: ReadingsChartContext): string {
  if (!projection || projection.from < ctx.range.from || projection.from > ctx.range.to) return '';
  const unit = ctx.unit ? ` ${ctx.unit}` : '';
  const level = Math.round(projection.interval.level * 100);
  const chance = Math.min(0.99, Math.max(0.01, projection.chance)).toFixed(2);
  return ` Early warning: projected ${projection.horizonMin} minutes ahead (${projection.model}), dashed, with its ${level} % band shaded; chance of passing the limit ${Number(projection.limit.toPrecision(6))}${unit}: p ≈ ${chance}.`;
}
