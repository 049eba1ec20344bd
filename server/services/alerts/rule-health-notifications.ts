import type { LabScope } from '../../db/tenant-scope.ts';
import { alertRulesRepo } from '../../db/alert-rules.repo.ts';
import { outboxRepo, type RuleHealthNotificationKind } from '../../db/notification-outbox.repo.ts';
import type { WatchedTarget } from '../../db/alert-readings.repo.ts';
import type { RuleBlindReason } from '../../contract/alerts.ts';
import { ruleHealthMail } from '../mail/rule-health-mail.ts';
import { mailTimeZone } from './alert-notifications.ts';

/** What a rule-health notification is about. */
export interface RuleHealthSubject {
  lab: { name: string; slug: string };
  publicUrl: string;
  rule: { id: number; name: string };
  target: WatchedTarget;
  kind: RuleHealthNotificationKind;
  /** The blind spell's number: the mails of one spell share it, so each goes out once. */
  episode: number;
  blind: { reason: RuleBlindReason; detail: string; since: number };
  /** The evaluation's clock: the mail is due from then, and "watches again since" is this moment. */
  now: number;
}

/**
 * Queues one not-watching or watching-again mail per subscriber of the rule, in the caller's
 * transaction (with the rule's recorded health, so both commit or neither). The outbox's
 * once-only key is (rule, subscriber, kind, spell), so queuing twice never mails twice. Times
 * follow each reader's clock choice as alert mail does.
 */
export async function queueRuleHealthMail(scope: LabScope, n: RuleHealthSubject): Promise<void> {
  const recipients = await alertRulesRepo(scope).recipients(n.rule.id);
  const watched = n.target.channelId === null ? n.target.label : `${n.target.loggerName} · ${n.target.label}`;
  const link =
    n.target.channelId === null
      ? `${n.publicUrl}/labs/${encodeURIComponent(n.lab.slug)}/alerts`
      : `${n.publicUrl}/labs/${encodeURIComponent(n.lab.slug)}/channels/${n.target.channelId}`;
  await outboxRepo(scope).enqueue(
    recipients.map((r) => {
      const mail = ruleHealthMail({
        to: r.email,
        labName: n.lab.name,
        kind: n.kind,
        ruleName: n.rule.name,
        watched,
        reason: n.blind.reason,
        detail: n.blind.detail,
        since: n.blind.since,
        at: n.now,
        link,
        timeZone: mailTimeZone(r.clock, n.target.timezone, r.timeZone),
      });
      return {
        alertId: n.rule.id,
        userId: r.userId,
        kind: n.kind,
        sequence: n.episode,
        to: r.email,
        subject: mail.subject,
        text: mail.text,
        html: mail.html ?? '',
      };
    }),
    n.now,
  );
}
