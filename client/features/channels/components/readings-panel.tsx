import { useEffect, useMemo, useRef } from 'react';
import { EChart, type ZoomWindow } from '../../../components/charts/echart.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import type { ChannelDetail } from '../api/get-channel.ts';
import { readingsCsvUrl, useSeries, type TimeRange } from '../api/get-series.ts';
import { RangePicker } from './range-picker.tsx';
import { zoomedRange, type RangePreset } from './range-presets.ts';
import { readingsChartOption, readingsSummary } from './readings-chart-option.ts';

const ZOOM_SETTLE_MS = 450;

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
}: {
  slug: string;
  channel: ChannelDetail;
  range: TimeRange;
  preset: RangePreset | null;
  onRange: (range: TimeRange, preset: RangePreset | null) => void;
  canExport: boolean;
}) {
  const series = useSeries(slug, channel.id, range);
  const ctx = useMemo(
    () => ({ label: channel.label, unit: channel.unit, timezone: channel.logger.timezone, validMin: channel.validMin, validMax: channel.validMax, range }),
    [channel, range],
  );
  const data = series.data?.series;
  const option = useMemo(() => (data ? readingsChartOption(data, ctx) : null), [data, ctx]);

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
      <RangePicker range={range} preset={preset} timezone={channel.logger.timezone} onChange={onRange} />
      {series.isError ? (
        <Notice tone="alert">{series.error.message}</Notice>
      ) : !option || !data ? (
        <LoadingNote what="Loading readings…" />
      ) : (
        <div aria-busy={series.isFetching} className={series.isPlaceholderData ? 'opacity-60' : ''}>
          <EChart option={option} label={`Readings of ${channel.label}`} summary={readingsSummary(data, ctx)} height={360} pngName={`${slug}-${channel.key}-readings`} onZoom={onZoom} />
          <p className="mt-1 text-xs text-ink-soft">Scroll or drag the slider to zoom; the zoomed range is fetched again at full detail.</p>
        </div>
      )}
    </section>
  );
}
