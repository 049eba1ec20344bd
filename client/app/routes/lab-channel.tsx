import { useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useChannel } from '../../features/channels/api/get-channel.ts';
import { useChannels } from '../../features/channels/api/get-channels.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { ChannelHeader } from '../../features/channels/components/channel-header.tsx';
import { presetRange, type RangePreset } from '../../features/channels/components/range-presets.ts';
import { ReadingsPanel } from '../../features/channels/components/readings-panel.tsx';
import { SafetyCautionNote } from '../../components/safety-caution-note.tsx';
import { CrossCorrelationPanel } from '../../features/diagnostics/components/cross-correlation-panel.tsx';
import { DiagnosticsPanel } from '../../features/diagnostics/components/diagnostics-panel.tsx';
import { RangeComparisonPanel } from '../../features/diagnostics/components/range-comparison-panel.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { useChannelAlerts } from '../../features/alerts/api/get-channel-alerts.ts';
import { alertBands } from '../../features/alerts/components/alert-bands.ts';
import { ChannelAlertsPanel } from '../../features/alerts/components/channel-alerts-panel.tsx';
import { useChannelNotes } from '../../features/notes/api/get-channel-notes.ts';
import { noteSpans } from '../../features/notes/components/note-spans.ts';
import { ChannelNotesPanel } from '../../features/notes/components/channel-notes-panel.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { useClock } from '../../components/clock/use-clock.ts';
import { ApiError } from '../../lib/api-client.ts';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

/**
 * `/labs/:lab/channels/:channelId`: one channel's header, readings chart, diagnostics and
 * cross-correlation. The chart's range is kept here, so the diagnostics default to it.
 */
export default function LabChannelRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const channelId = Number(useParams().channelId);
  const can = (p: (typeof detail.permissions)[number]) => detail.permissions.includes(p);
  const channel = useChannel(slug, channelId);
  const all = useChannels(slug);
  const clock = useClock();
  // `?from=…&to=…` (epoch ms, as alert mail links carry) opens the chart on that range.
  const [search] = useSearchParams();
  const [view, setView] = useState<{ range: TimeRange; preset: RangePreset | null }>(() => {
    const from = Number(search.get('from'));
    const to = Number(search.get('to'));
    if (search.has('from') && search.has('to') && Number.isSafeInteger(from) && Number.isSafeInteger(to) && from < to)
      return { range: { from, to }, preset: null };
    return { range: presetRange('7d', Date.now()), preset: '7d' };
  });
  const channelAlerts = useChannelAlerts(slug, channelId, view.range, can('alerts.read'));
  const bands = useMemo(() => alertBands(channelAlerts.data?.alerts ?? [], view.range, Date.now()), [channelAlerts.data, view.range]);
  const notes = useChannelNotes(slug, channelId, view.range);
  const spans = useMemo(() => noteSpans(notes.data?.notes ?? []), [notes.data]);
  const partners = useMemo(
    () => (all.data?.channels ?? []).filter((c) => c.id !== channelId).map((c) => ({ id: c.id, label: c.label, loggerName: c.logger.name })),
    [all.data, channelId],
  );

  if (!can('channels.read')) return <MissingPermission what="the channels" />;
  if (channel.isPending) return <LoadingNote what="Opening the channel…" />;
  if (channel.isError) {
    if (channel.error instanceof ApiError && channel.error.status === 404) {
      return (
        <Notice tone="status">
          This lab has no channel {Number.isFinite(channelId) ? channelId : ''}.{' '}
          <Link to={paths.labChannels.href(slug)} className="underline">
            Back to the channels
          </Link>
        </Notice>
      );
    }
    return <Notice tone="alert">{channel.error.message}</Notice>;
  }
  const c = channel.data.channel;
  return (
    <div className="grid gap-5">
      <Link to={paths.labChannels.href(slug)} className="text-sm text-lichen-dark underline-offset-2 hover:underline">
        ← All channels
      </Link>
      <ChannelHeader channel={c} now={Date.now()} />
      <SafetyCautionNote channel={c} />
      <ReadingsPanel
        slug={slug}
        canReadAlerts={can('alerts.read')}
        channel={c}
        range={view.range}
        preset={view.preset}
        onRange={(range, preset) => setView({ range, preset })}
        canExport={can('exports.create')}
        bands={bands}
        notes={spans}
        beside={
          <ChannelNotesPanel
            slug={slug}
            channel={c}
            range={view.range}
            notes={notes.data?.notes ?? []}
            loading={notes.isPending}
            error={notes.error}
            canEdit={can('loggers.manage') && c.retiredAt === null}
            canExport={can('exports.create')}
          />
        }
      />
      {can('alerts.read') && channelAlerts.data && (
        <ChannelAlertsPanel
          slug={slug}
          channelId={c.id}
          alerts={channelAlerts.data.alerts}
          canAcknowledge={can('alerts.manage')}
          loggerZone={c.logger.timezone}
        />
      )}
      {can('diagnostics.read') && (
        <>
          <DiagnosticsPanel
            slug={slug}
            channelId={c.id}
            channelKey={c.key}
            timezone={clock.zoneFor('readings', c.logger.timezone)}
            chartRange={view.range}
            canExport={can('exports.create')}
          />
          <CrossCorrelationPanel
            slug={slug}
            channelId={c.id}
            channelLabel={c.label}
            chartRange={view.range}
            partners={partners}
            stepS={c.expectedIntervalS ?? c.logger.expectedIntervalS}
          />
          <RangeComparisonPanel
            slug={slug}
            channelId={c.id}
            channelLabel={c.label}
            timezone={clock.zoneFor('readings', c.logger.timezone)}
            chartRange={view.range}
            partners={partners}
          />
        </>
      )}
    </div>
  );
}
