import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { keepPreviousData, useQueries } from '@tanstack/react-query';
import type { TimeRange } from '@shared/contract/channels.ts';
import { paths } from '../../../app/paths.ts';
import { Button } from '../../../components/button.tsx';
import { EChart, type ZoomWindow } from '../../../components/charts/echart.tsx';
import { SelectField } from '../../../components/form-field.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { formatInstant, zoneOffsetLabel } from '../../../components/clock/format.ts';
import { useClock } from '../../../components/clock/use-clock.ts';
import { seriesQueryOptions } from '../api/get-series.ts';
import { RangePicker } from './range-picker.tsx';
import { presetRange, zoomedRange, type RangePreset } from './range-presets.ts';
import { needsSafetyCaution } from '../../../components/safety-caution.ts';
import { useTogetherChannels } from '../hooks/use-together-channels.ts';
import { togetherChartHeight, togetherChartOption, togetherSummary, type DrawnLine } from './together-chart-option.ts';
import { togetherCsv } from './together-csv.ts';
import { chooseZone, planLines, zoneChoices, type PlannedLine } from './together-lines.ts';
import { readTogetherParams, TOGETHER_PARAMS, withRangeAndZone } from './together-url.ts';

const ZOOM_SETTLE_MS = 450;

/** Offers `text` as a file download named `name` (the CSV is made in the browser from what the chart shows). */
function downloadText(text: string, name: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/**
 * Up to six channels of any loggers of the lab on one chart, as the URL names them (see
 * `together-url.ts`): what the URL asked for that cannot be drawn is named above the chart;
 * then the clock the times are shown on (the first channel's logger zone unless the URL picks
 * another of the channels' zones or UTC), the range controls of the channel page, the chart
 * (zooming fetches the zoomed range again at full detail) and the exports of exactly what is
 * drawn: CSV (when the role may export) and PNG.
 */
export function ChannelsTogether({ slug, canExport }: { slug: string; canExport: boolean }) {
  const [params, setParams] = useSearchParams();
  const asked = useMemo(() => readTogetherParams(params), [params]);
  const [fallback] = useState(() => presetRange('7d', Date.now()));
  const [preset, setPreset] = useState<RangePreset | null>(asked.range ? null : '7d');
  const range = asked.range ?? fallback;
  const found = useTogetherChannels(slug, asked.ids);
  const plan = useMemo(() => planLines(found.channels), [found.channels]);
  // the chooser offers the loggers' zones, UTC and the person's own; by default the person's clock choice decides
  const clock = useClock();
  const choices = [...new Set([...zoneChoices(plan.lines), clock.myZone])];
  const { zone, problem: zoneProblem } = chooseZone(asked.zone, choices, clock.zoneFor('readings', choices[0]));

  // A page opened without a range (from the channels table) writes the default into its URL,
  // so the link copied from the address bar shows a colleague the same stretch of time.
  const noRangeAsked = !params.has(TOGETHER_PARAMS.from) && !params.has(TOGETHER_PARAMS.to);
  useEffect(() => {
    if (noRangeAsked && asked.ids.length > 0) setParams((p) => withRangeAndZone(p, fallback, p.get(TOGETHER_PARAMS.zone)), { replace: true });
  }, [noRangeAsked, asked.ids.length, fallback, setParams]);

  function setView(next: TimeRange, nextPreset: RangePreset | null, nextZone: string | null = asked.zone) {
    setPreset(nextPreset);
    setParams((p) => withRangeAndZone(p, next, nextZone));
  }

  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useEffect(() => () => clearTimeout(timer.current), []);
  function onZoom(z: ZoomWindow) {
    clearTimeout(timer.current);
    if (z.start <= 0 && z.end >= 1) return;
    timer.current = setTimeout(() => setView(zoomedRange(range, z.start, z.end), null), ZOOM_SETTLE_MS);
  }

  const problems = [...asked.problems, ...found.problems, ...plan.problems, ...(zoneProblem ? [zoneProblem] : [])];
  const back = (
    <Link to={paths.labChannels.href(slug)} className="text-sm text-lichen-dark underline-offset-2 hover:underline">
      ← All channels
    </Link>
  );
  const heading = (
    <h2 id="together-heading" className="text-2xl font-semibold">
      Channels together
    </h2>
  );
  if (asked.ids.length === 0 && problems.length === 0)
    return (
      <div className="grid gap-4">
        {back}
        {heading}
        <Notice tone="status">No channels chosen yet: tick up to six in the channels table, then “Open together”.</Notice>
      </div>
    );

  return (
    <section aria-labelledby="together-heading" className="grid min-w-0 gap-4">
      {back}
      {heading}
      {problems.length > 0 && (
        <Notice tone="alert">
          <p className="font-medium">Part of this link could not be used:</p>
          <ul className="mt-1 list-disc pl-5">
            {problems.map((p) => (
              <li key={p} className="break-words">
                {p}
              </li>
            ))}
          </ul>
          {!found.pending && (
            <p className="mt-1" data-testid="together-kept">
              {plan.lines.length > 0 ? `Drawn: ${plan.lines.map((l) => l.name).join('; ')}.` : 'Nothing could be drawn from this link.'}
            </p>
          )}
        </Notice>
      )}
      {found.pending ? (
        <LoadingNote what="Finding the channels…" />
      ) : found.error ? (
        <Notice tone="alert">{found.error.message}</Notice>
      ) : plan.lines.length === 0 ? (
        <Notice tone="status">
          No channel of this link can be drawn.{' '}
          <Link to={paths.labChannels.href(slug)} className="underline">
            Choose channels in the channels table
          </Link>
          .
        </Notice>
      ) : (
        <TogetherChart
          // a new set of lines is a new chart: the memo below keys on one data item per line
          key={plan.lines.map((l) => l.channel.id).join(',')}
          slug={slug}
          lines={plan.lines}
          axes={plan.axes}
          range={range}
          preset={preset}
          zone={zone}
          choices={choices}
          canExport={canExport}
          onRange={(r, p) => setView(r, p)}
          onZone={(z) => setView(range, preset, z)}
          onZoom={onZoom}
        />
      )}
    </section>
  );
}

function TogetherChart({
  slug,
  lines,
  axes,
  range,
  preset,
  zone,
  choices,
  canExport,
  onRange,
  onZone,
  onZoom,
}: {
  slug: string;
  lines: PlannedLine[];
  axes: ReturnType<typeof planLines>['axes'];
  range: TimeRange;
  preset: RangePreset | null;
  zone: string;
  choices: string[];
  canExport: boolean;
  onRange: (range: TimeRange, preset: RangePreset | null) => void;
  onZone: (zone: string) => void;
  onZoom: (z: ZoomWindow) => void;
}) {
  // One series request per channel, in parallel, under the channel page's own cache keys.
  const series = useQueries({ queries: lines.map((l) => ({ ...seriesQueryOptions(slug, l.channel.id, range), placeholderData: keepPreviousData })) });
  const datas = series.map((s) => s.data);
  const allData = datas.every(Boolean);
  const drawn = useMemo<DrawnLine[] | null>(
    () => (allData ? lines.map((l, i) => ({ ...l, series: datas[i]!.series })) : null),
    [allData, lines, ...datas], // eslint-disable-line react-hooks/exhaustive-deps
  );
  // the chart's width, so long legend names are cut to fit (a phone is narrower than the longest name)
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState<number | undefined>(undefined);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const seen = new ResizeObserver(() => setWidth((w) => (Math.abs((w ?? 0) - el.clientWidth) > 24 ? el.clientWidth : w)));
    seen.observe(el);
    return () => seen.disconnect();
  }, []);
  const ctx = useMemo(() => ({ range, zone, width }), [range, zone, width]);
  const option = useMemo(() => (drawn ? togetherChartOption(drawn, axes, ctx) : null), [drawn, axes, ctx]);
  const failed = series.map((s, i) => (s.isError ? `${lines[i].name}: ${s.error.message}` : null)).filter((m): m is string => m !== null);
  const historyStart = Math.max(...datas.map((d) => d?.historyStartsAt ?? -Infinity));
  const cautions = lines.filter((l) => needsSafetyCaution(l.channel));
  const owners = lines.filter((l) => l.channel.logger.timezone === zone).map((l) => l.channel.logger.name);
  const whose = owners.length > 0 ? `the clock of ${[...new Set(owners)].join(', ')}` : zone === 'UTC' ? 'Coordinated Universal Time' : 'your own clock';

  return (
    <div ref={box} className="grid min-w-0 gap-4">
      {cautions.length > 0 && (
        <aside aria-label="Safety note" className="rounded-lg border border-amber bg-amber/10 p-3 text-sm">
          <strong>Not an alarm system.</strong> Lagbook’s readings of {cautions.map((l) => l.name).join(', ')} are not a certified alarm: they can arrive late
          or not at all. Your lab’s own safety rules, alarm equipment and local regulations apply.
        </aside>
      )}
      <div className="grid min-w-0 gap-3 rounded-xl border border-rule bg-card p-3 sm:p-4">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <p className="text-sm" data-testid="together-zone">
            Times are shown in <strong>{zone}</strong> ({zoneOffsetLabel((range.from + range.to) / 2, zone)} in the middle of the range), {whose}.
          </p>
          <div className="w-56 max-w-full">
            <SelectField label="Show times in" value={zone} onChange={(e) => onZone(e.target.value)}>
              {choices.map((z) => (
                <option key={z} value={z}>
                  {z.replaceAll('_', ' ')}
                </option>
              ))}
            </SelectField>
          </div>
        </div>
        <RangePicker key={zone} range={range} preset={preset} timezone={zone} onChange={onRange} />
        {Number.isFinite(historyStart) && (
          <Notice tone="status">
            The lab’s plan shows readings from {formatInstant(historyStart, zone, { part: 'date' })} on; older readings are kept and come back with a plan that
            keeps more history.
          </Notice>
        )}
        {failed.length > 0 && (
          <Notice tone="alert">
            {failed.map((m) => (
              <p key={m}>{m}</p>
            ))}
          </Notice>
        )}
        {!option || !drawn ? (
          failed.length === 0 && <LoadingNote what="Loading readings…" />
        ) : (
          <div aria-busy={series.some((s) => s.isFetching)} className={series.some((s) => s.isPlaceholderData) ? 'min-w-0 opacity-60' : 'min-w-0'}>
            <EChart
              option={option}
              label={`${lines.length} channels on one time axis`}
              summary={togetherSummary(drawn, ctx)}
              height={togetherChartHeight(lines.length)}
              pngName={`${slug}-channels-together`}
              onZoom={onZoom}
            />
            <p className="mt-1 text-xs text-ink-soft">
              Scroll or drag the slider to zoom; the zoomed range is fetched again at full detail. Over long ranges each line shows the mean of each time cell
              (its size is in the legend); open a channel alone to see each cell’s lowest and highest reading.
            </p>
            {canExport && (
              <Button
                size="sm"
                tone="quiet"
                className="mt-1"
                onClick={() => downloadText(togetherCsv(drawn, zone), `${slug}-channels-together.csv`, 'text/csv;charset=utf-8')}
              >
                Download what is shown (CSV)
              </Button>
            )}
          </div>
        )}
      </div>
      <ul className="grid gap-1 text-sm" aria-label="Lines on the chart">
        {lines.map((l) => (
          <li key={l.channel.id} className="flex flex-wrap items-center gap-2">
            <LineSample look={l.look} />
            <Link to={paths.labChannel.href(slug, l.channel.id)} className="break-words text-lichen-dark underline-offset-2 hover:underline">
              {l.name}
            </Link>
            <span className="text-xs text-ink-soft">
              ({l.look.name}; axis {axes[l.axis].name}, {axes[l.axis].position})
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** A short stretch of a line in its colour and dash, with its symbol's place marked, for the list of lines. */
function LineSample({ look }: { look: PlannedLine['look'] }) {
  return (
    <svg width="36" height="12" aria-hidden="true" className="shrink-0">
      <line x1="1" y1="6" x2="35" y2="6" stroke={look.color} strokeWidth="2" strokeDasharray={look.dash === 'solid' ? undefined : look.dash.join(' ')} />
    </svg>
  );
}
