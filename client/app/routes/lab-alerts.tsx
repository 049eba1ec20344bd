import { useMemo } from 'react';
import { useChannels } from '../../features/channels/api/get-channels.ts';
import { AlertsPage } from '../../features/alerts/components/alerts-page.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { paths } from '../paths.ts';
import { useLabContext } from './lab-context.ts';

const HOUR = 3_600_000;

/** `/labs/:lab/alerts`: the alert centre (every role that may read channels). */
export default function LabAlertsRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const channels = useChannels(slug);
  const targets = useMemo(
    () => (channels.data?.channels ?? []).map((c) => ({ id: c.id, label: c.label, unit: c.unit, loggerId: c.logger.id, loggerName: c.logger.name })),
    [channels.data],
  );
  // each alert's times on the clock of its logger (the channels list carries the loggers' zones)
  const zones = useMemo(() => new Map((channels.data?.channels ?? []).map((c) => [c.logger.id, c.logger.timezone])), [channels.data]);
  if (!detail.permissions.includes('alerts.read')) return <MissingPermission what="the alerts" />;
  return (
    <AlertsPage
      slug={slug}
      targets={targets}
      channelHref={(a) =>
        a.channelId === null ? null : `${paths.labChannel.href(slug, a.channelId)}?from=${a.openedAt - 6 * HOUR}&to=${(a.resolvedAt ?? a.openedAt) + HOUR}`
      }
      zoneOf={(a) => (a.loggerId === null ? null : zones.get(a.loggerId))}
      can={{ manage: detail.permissions.includes('alerts.manage'), subscribe: detail.permissions.includes('alerts.subscribe') }}
    />
  );
}
