import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { useAlertRules } from '../api/get-alert-rules.ts';
import type { Alert } from '@shared/contract/alerts.ts';
import { useAlerts } from '../api/get-alerts.ts';
import { AlertRuleForm, type RuleTarget } from './alert-rule-form.tsx';
import { AlertRulesList } from './alert-rules-list.tsx';
import { AlertsList } from './alerts-list.tsx';

/**
 * The lab's alert centre: open alerts (acknowledge with a note), alerts of the last 7 days,
 * the rules (subscribe, turn off, delete) and, for technicians and admins, a new rule with the
 * caution beside it.
 */
export function AlertsPage({
  slug,
  targets,
  channelHref,
  can,
  zoneOf,
}: {
  slug: string;
  targets: RuleTarget[];
  channelHref: (a: Alert) => string | null;
  can: { manage: boolean; subscribe: boolean };
  /** The IANA zone of an alert's (or a rule's) logger (its times show on that clock by default). */
  zoneOf?: (a: Pick<Alert, 'loggerId'>) => string | null | undefined;
}) {
  const alerts = useAlerts(slug);
  const rules = useAlertRules(slug);
  const open = alerts.data?.alerts.filter((a) => a.open) ?? [];
  const recent = alerts.data?.alerts.filter((a) => !a.open) ?? [];
  return (
    <div className="grid gap-8">
      <div>
        <h2 className="text-2xl font-semibold">Alerts</h2>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          Rules watch the lab’s channels and loggers; when one fires, everyone subscribed to it is mailed when it opens, while it stays open, and when it
          resolves.
        </p>
      </div>
      {alerts.isPending && <LoadingNote what="Loading alerts…" />}
      {alerts.isError && <Notice tone="alert">{alerts.error.message}</Notice>}
      {alerts.data && (
        <>
          <section aria-labelledby="open-alerts-heading" className="grid gap-3">
            <h3 id="open-alerts-heading" className="text-lg font-semibold">
              Open now ({open.length})
            </h3>
            <AlertsList slug={slug} alerts={open} channelHref={channelHref} canAcknowledge={can.manage} label="Open alerts" zoneOf={zoneOf} />
          </section>
          <section aria-labelledby="recent-alerts-heading" className="grid gap-3">
            <h3 id="recent-alerts-heading" className="text-lg font-semibold">
              Resolved in the last 7 days
            </h3>
            <AlertsList slug={slug} alerts={recent} channelHref={channelHref} canAcknowledge={false} label="Recent alerts" zoneOf={zoneOf} />
          </section>
        </>
      )}
      <section aria-labelledby="rules-heading" className="grid gap-3">
        <h3 id="rules-heading" className="text-lg font-semibold">
          Rules
        </h3>
        {rules.isPending && <LoadingNote what="Loading rules…" />}
        {rules.isError && <Notice tone="alert">{rules.error.message}</Notice>}
        {rules.data && (
          <AlertRulesList
            slug={slug}
            rules={rules.data.rules}
            canManage={can.manage}
            canSubscribe={can.subscribe}
            zoneOf={(r) => zoneOf?.({ loggerId: r.watched.loggerId })}
          />
        )}
      </section>
      {can.manage && <AlertRuleForm slug={slug} targets={targets} />}
    </div>
  );
}
