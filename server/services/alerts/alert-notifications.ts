import type { ClockChoice } from '../../contract/me.ts';
import type { AlertStage } from '../../contract/alerts.ts';
import type { LabScope } from '../../db/tenant-scope.ts';
import { alertRulesRepo } from '../../db/alert-rules.repo.ts';
import { outboxRepo, type AlertNotificationKind } from '../../db/notification-outbox.repo.ts';
import type { WatchedTarget } from '../../db/alert-readings.repo.ts';
import { alertMail, channelLinkAt } from '../mail/alert-mail.ts';
import { withUnit } from './rules/rule-step.ts';

/** What a notification is about. */
export interface NotificationSubject {
  lab: { name: string; slug: string };
  publicUrl: string;
  rule: { id: number; name: string };
  target: WatchedTarget;
  alert: { id: number; openedAt: number; stage?: AlertStage };
  kind: AlertNotificationKind;
  sequence: number;
  at: number;
  /** The evaluation's clock (the mail is due from then). */
  now: number;
  value: number | null;
  detail: string;
}

/**
 * The zone an alert mail gives its times on, following the reader's clock choice as the app does:
 * `logger` → the logger's zone (alerts are readings-related); `mine` → the reader's saved zone
 * (the server never sees their browser, so without a saved zone: UTC); `utc` → UTC. The mail
 * names the zone beside each time.
 */
export function mailTimeZone(clock: ClockChoice, loggerZone: string, readerZone: string | null): string {
  if (clock === 'logger') return loggerZone;
  if (clock === 'mine') return readerZone ?? 'UTC';
  return 'UTC';
}

/**
 * Queues one mail per subscriber of the rule for one alert event, in the caller's transaction
 * (so the event and its mail commit together or not at all).
 */
export async function queueAlertMail(scope: LabScope, n: NotificationSubject): Promise<void> {
  const recipients = await alertRulesRepo(scope).recipients(n.rule.id);
  const watched = n.target.channelId === null ? n.target.label : `${n.target.loggerName} · ${n.target.label}`;
  const link =
    n.target.channelId === null
      ? `${n.publicUrl}/labs/${encodeURIComponent(n.lab.slug)}/alerts`
      : channelLinkAt(n.publicUrl, n.lab.slug, n.target.channelId, n.alert.openedAt, n.kind === 'resolved' ? n.at : undefined);
  // the stored reading at its own resolution (the decimals it came with), with the unit
  const reading = n.value === null ? null : withUnit(n.value, n.target.unit);
  await outboxRepo(scope).enqueue(
    recipients.map((r) => {
      const mail = alertMail({
        to: r.email,
        labName: n.lab.name,
        kind: n.kind,
        sequence: n.sequence,
        ruleName: n.rule.name,
        watched,
        reading,
        at: n.at,
        detail: n.detail,
        openedAt: n.alert.openedAt,
        link,
        timeZone: mailTimeZone(r.clock, n.target.timezone, r.timeZone),
        stage: n.alert.stage,
      });
      return {
        alertId: n.alert.id,
        userId: r.userId,
        kind: n.kind,
        sequence: n.sequence,
        to: r.email,
        subject: mail.subject,
        text: mail.text,
        html: mail.html ?? '',
      };
    }),
    n.now,
  );
}
