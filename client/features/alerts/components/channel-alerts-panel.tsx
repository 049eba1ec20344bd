import type { Alert } from '@shared/contract/alerts.ts';
import { AlertsList } from './alerts-list.tsx';

/** The channel page's list of alerts over the chart's range (the chart shades the same stretches); times on the clock of the channel's logger (`loggerZone`) by default. */
export function ChannelAlertsPanel({
  slug,
  alerts,
  canAcknowledge,
  loggerZone,
}: {
  slug: string;
  alerts: Alert[];
  canAcknowledge: boolean;
  loggerZone?: string;
}) {
  return (
    <section aria-labelledby="channel-alerts-heading" className="grid gap-3 rounded-xl border border-rule bg-card p-4">
      <h3 id="channel-alerts-heading" className="text-lg font-semibold">
        Alerts in this range ({alerts.length})
      </h3>
      <AlertsList
        slug={slug}
        alerts={alerts}
        channelHref={() => null}
        canAcknowledge={canAcknowledge}
        label="Alerts of this channel"
        zoneOf={() => loggerZone}
      />
    </section>
  );
}
