import { useParams } from 'react-router-dom';
import type { Alert } from '@shared/contract/alerts.ts';
import { useAlertRules } from '../api/get-alert-rules.ts';
import { AlertsList } from './alerts-list.tsx';
import { RuleHealthLine } from './rule-health-line.tsx';

/**
 * The rules that judge this channel's readings, each with whether it is watching (a blind rule
 * stands out as a warning). Rules on a whole logger (silence) are not listed: they have no
 * health of their own.
 */
function ChannelRulesHealth({ slug, channelId, loggerZone }: { slug: string; channelId: number; loggerZone?: string }) {
  const rules = useAlertRules(slug);
  const mine = (rules.data?.rules ?? []).filter((r) => r.channelId === channelId && r.kind !== 'silence' && r.enabled);
  if (mine.length === 0) return null;
  return (
    <ul aria-label="Rules watching this channel" className="grid gap-2">
      {mine.map((r) => (
        <li key={r.id} className="grid gap-1">
          <span className="text-sm font-medium">{r.name}</span>
          <RuleHealthLine rule={r} loggerZone={loggerZone} />
        </li>
      ))}
    </ul>
  );
}

/**
 * The channel page's alert panel: whether each rule on the channel is watching, then the alerts
 * over the chart's range (the chart shades the same stretches); times on the clock of the
 * channel's logger (`loggerZone`) by default. The channel comes from `channelId`, else from the
 * page's address (`/labs/:lab/channels/:channelId`).
 */
export function ChannelAlertsPanel({
  slug,
  alerts,
  canAcknowledge,
  loggerZone,
  channelId,
}: {
  slug: string;
  alerts: Alert[];
  canAcknowledge: boolean;
  loggerZone?: string;
  channelId?: number;
}) {
  const fromAddress = Number(useParams().channelId);
  const channel = channelId ?? (Number.isInteger(fromAddress) ? fromAddress : null);
  return (
    <section aria-labelledby="channel-alerts-heading" className="grid gap-3 rounded-xl border border-rule bg-card p-4">
      <h3 id="channel-alerts-heading" className="text-lg font-semibold">
        Alerts in this range ({alerts.length})
      </h3>
      {channel !== null && <ChannelRulesHealth slug={slug} channelId={channel} loggerZone={loggerZone} />}
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
