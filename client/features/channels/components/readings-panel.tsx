import { useEffect, useMemo, useRef, type ReactNode } from 'react';
import type { EChartsCoreOption } from 'echarts/core';
import { EChart, type ZoomWindow } from '../../../components/charts/echart.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import { useClock } from '../../../components/clock/use-clock.ts';
import type { ChannelDetail } from '@shared/contract/channels.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { readingsCsvUrl, useSeries } from '../api/get-series.ts';
import { useChannelTestReadings } from '../../loggers/api/test-readings.ts';
import { RangePicker } from './range-picker.tsx';
import { zoomedRange, type RangePreset } from './range-presets.ts';
import { noteSpansSummary, readingsChartOption, readingsSummary, withNoteSpans, type NoteSpan } from './readings-chart-option.ts';
import { testReadingsSummary, withTestReadings, type TestReadingPoint } from './readings-chart-option.ts';
import { projectionSummary, withProjection, type ChartProjection } from './readings-chart-option.ts';
import { useChannelAlerts } from '../../alerts/api/get-channel-alerts.ts';

const ZOOM_SETTLE_MS = 450;

const NO_BANDS: readonly ChartBand[] = [];
/** Alert bands: a solid outline in the alert colour over a fill light enough to read the line through. */
export const ALERT_EDGE = '#b23a2a';
export const ALERT_FILL = 'rgba(178, 58, 42, 0.24)';
const NO_NOTES: readonly NoteSpan[] = [];
const NO_TESTS: readonly TestReadingPoint[] = [];

/** A stretch of time to shade on the chart (e.g. while an alert was open). */
export interface ChartBand {
  from: number;
  to: number;
  label: string;
}

/**
 * The chart option with `bands` shaded over the full height: each band is a filled line on a
 * hidden 0–1 axis (only the line chart is registered, so no extra ECharts component is needed)
 * drawn as a closed box, so its left, top and right edges carry a solid outline. However short
 * the alert, its band is at least 1/100 of the chart's time range wide (widened around its
 * middle, kept inside the range), so a ten-minute alert stays visible on a month's chart.
 */
export function withBands(option: EChartsCoreOption, bands: readonly ChartBand[]): EChartsCoreOption {
  if (bands.length === 0) return option;
  const yAxes = (Array.isArray(option.yAxis) ? option.yAxis : [option.yAxis]) as EChartsCoreOption[];
  const axis = option.xAxis as { min?: unknown; max?: unknown } | undefined;
  const lo = typeof axis?.min === 'number' ? axis.min : -Infinity;
  const hi = typeof axis?.max === 'number' ? axis.max : Infinity;
  const least = Number.isFinite(hi - lo) ? (hi - lo) / 100 : 0;
  const shaded = bands.map((b) => {
    const grow = Math.max(0, least - (b.to - b.from)) / 2;
    const from = Math.max(lo, Math.min(b.from - grow, hi - least));
    const to = Math.min(hi, Math.max(b.to + grow, from + least));
    return {
      name: `Alert: ${b.label}`,
      type: 'line',
      yAxisIndex: yAxes.length,
      data: [
        [from, 0],
        [from, 1],
        [to, 1],
        [to, 0],
      ],
      showSymbol: false,
      lineStyle: { width: 1.5, color: ALERT_EDGE },
      itemStyle: { color: ALERT_EDGE },
      areaStyle: { color: ALERT_FILL, opacity: 1 },
      tooltip: { show: false },
      silent: true,
      z: 1,
    };
  });
  const series = option.series as EChartsCoreOption[];
  // the legend keeps naming only the chart's own lines
  const legend = option.legend ? { ...(option.legend as EChartsCoreOption), data: series.map((s) => s.name).filter(Boolean) } : undefined;
  return { ...option, ...(legend ? { legend } : {}), yAxis: [...yAxes, { type: 'value', min: 0, max: 1, show: false }], series: [...series, ...shaded] };
}

/**
 * The readings of one channel over the chosen range: range presets and custom range, the chart
 * (zooming asks the server for the zoomed range, so detail is never lost to downsampling), and
 * exports of the range as CSV (when the role may export) and the chart as PNG.
 */
export function ReadingsPanel({
  slug,
  channel,
  range,
  preset,
  onRange,
  canExport,
  bands = NO_BANDS,
  notes = NO_NOTES,
  beside,
  canReadAlerts = true,
}: {
  slug: string;
  channel: ChannelDetail;
  range: TimeRange;
  preset: RangePreset | null;
  onRange: (range: TimeRange, preset: RangePreset | null) => void;
  canExport: boolean;
  /** Stretches to shade (when alerts were open), from the channel page. */
  bands?: readonly ChartBand[];
  /** Notes to shade with their words (from the channel page). */
  notes?: readonly NoteSpan[];
  /** Shown under the chart (the channel page puts the notes list there). */
  beside?: ReactNode;
  /** Whether the person may read alerts: an open early warning's projection is drawn only then. */
  canReadAlerts?: boolean;
}) {
  const series = useSeries(slug, channel.id, range);
  // test readings are drawn apart from the readings (their own series and marker)
  const tests = useChannelTestReadings(slug, channel.id, range).data?.testReadings ?? NO_TESTS;
  // the chart and the range are on the clock the person chose for readings (the logger's by default)
  const zone = useClock().zoneFor('readings', channel.logger.timezone);
  const ctx = useMemo(
    () => ({ label: channel.label, unit: channel.unit, timezone: zone, validMin: channel.validMin, validMax: channel.validMax, range }),
    [channel, range, zone],
  );
  // an open early warning's projection (the same query as the page's alert bands, so no second request)
  const alerts = useChannelAlerts(slug, channel.id, range, canReadAlerts).data?.alerts;
  const projection = useMemo(
    () => (alerts?.find((a) => a.open && a.stage === 'expected' && a.projection)?.projection ?? null) as ChartProjection | null,
    [alerts],
  );
  const data = series.data?.series;
  const option = useMemo(
    () =>
      data
        ? withNoteSpans(withBands(withProjection(withTestReadings(readingsChartOption(data, ctx), tests, data, ctx), projection, ctx), bands), notes, range)
        : null,
    [data, ctx, bands, notes, range, tests, projection],
  );

  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useEffect(() => () => clearTimeout(timer.current), []);
  function onZoom(z: ZoomWindow) {
    clearTimeout(timer.current);
    if (z.start <= 0 && z.end >= 1) return;
    timer.current = setTimeout(() => onRange(zoomedRange(range, z.start, z.end), null), ZOOM_SETTLE_MS);
  }

  return (
    <section aria-labelledby="readings-heading" className="grid gap-3 rounded-xl border border-rule bg-card p-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h3 id="readings-heading" className="text-lg font-semibold">
          Readings
        </h3>
        {canExport && (
          <a href={readingsCsvUrl(slug, channel.id, range)} download className="text-sm font-medium text-lichen-dark underline underline-offset-2">
            Download readings of this range (CSV)
          </a>
        )}
      </div>
      <RangePicker range={range} preset={preset} timezone={zone} onChange={onRange} />
      {series.data?.historyStartsAt != null && (
        <Notice tone="status">
          The lab’s plan shows readings from <Instant at={series.data.historyStartsAt} kind="readings" loggerZone={channel.logger.timezone} part="date" /> on;
          older readings are kept and come back with a plan that keeps more history.
        </Notice>
      )}
      {series.isError ? (
        <Notice tone="alert">{series.error.message}</Notice>
      ) : !option || !data ? (
        <LoadingNote what="Loading readings…" />
      ) : (
        <div aria-busy={series.isFetching} className={series.isPlaceholderData ? 'opacity-60' : ''}>
          <EChart
            option={option}
            label={`Readings of ${channel.label}`}
            summary={readingsSummary(data, ctx) + testReadingsSummary(tests, ctx) + projectionSummary(projection, ctx) + noteSpansSummary(notes, range)}
            height={360}
            pngName={`${slug}-${channel.key}-readings`}
            onZoom={onZoom}
          />
          <p className="mt-1 text-xs text-ink-soft">Scroll or drag the slider to zoom; the zoomed range is fetched again at full detail.</p>
        </div>
      )}
      {beside}
    </section>
  );
}
