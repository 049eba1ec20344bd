import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

/** Mail about an alert: it opened, is still open (reminder n), resolved. */
export type AlertNotificationKind = 'opened' | 'reminder' | 'resolved';
/** Mail about a rule's health: it stopped watching (after its delay), it watches again. */
export type RuleHealthNotificationKind = 'not-watching' | 'watching-again';
export type NotificationKind = AlertNotificationKind | RuleHealthNotificationKind;

export interface OutboxMessage {
  id: number;
  /**
   * What the mail is about, the first part of its once-only key: the alert for alert mail, the
   * rule for a rule-health mail (ids of lab rows are random 48-bit numbers, so the two never meet;
   * their kinds differ besides). The column keeps its first name, `alert_id`.
   */
  alertId: number;
  userId: number;
  kind: NotificationKind;
  sequence: number;
  to: string;
  subject: string;
  text: string;
  html: string;
  attempts: number;
}

/** Data access for one lab's `notification_outbox`. */
export function outboxRepo(scope: LabScope) {
  return {
    /**
     * Queues messages; a row already queued for the same (alert, subscriber, kind, sequence) is
     * left as it is (the unique key), so queuing twice never mails twice.
     */
    async enqueue(rows: Array<Omit<OutboxMessage, 'id' | 'attempts'>>, now: number): Promise<void> {
      if (rows.length === 0) return;
      await scope
        .insert(
          'notification_outbox',
          rows.map((r) => ({
            id: newId(),
            alert_id: r.alertId,
            user_id: r.userId,
            kind: r.kind,
            sequence: r.sequence,
            to_address: r.to,
            subject: r.subject.slice(0, 255),
            body_text: r.text,
            body_html: r.html,
            next_attempt_at: now,
          })),
        )
        .onConflict(['tenant_id', 'alert_id', 'user_id', 'kind', 'sequence'])
        .ignore();
    },
    /** Unsent messages due at `now` and not claimed by another sender, oldest first. */
    async due(now: number, limit: number): Promise<OutboxMessage[]> {
      const rows = await scope
        .table('notification_outbox')
        .whereNull('notification_outbox.sent_at')
        .where('notification_outbox.next_attempt_at', '<=', now)
        .where((w) => w.whereNull('notification_outbox.claimed_until').orWhere('notification_outbox.claimed_until', '<', now))
        .orderBy('notification_outbox.next_attempt_at')
        .limit(limit)
        .select(
          'notification_outbox.id',
          'notification_outbox.alert_id as alertId',
          'notification_outbox.user_id as userId',
          'notification_outbox.kind',
          'notification_outbox.sequence',
          'notification_outbox.to_address as to',
          'notification_outbox.subject',
          'notification_outbox.body_text as text',
          'notification_outbox.body_html as html',
          'notification_outbox.attempts',
        );
      return rows.map((r: Record<string, unknown>) => ({
        ...(r as unknown as OutboxMessage),
        id: Number(r.id),
        alertId: Number(r.alertId),
        userId: Number(r.userId),
        sequence: Number(r.sequence),
        attempts: Number(r.attempts),
      }));
    },
    /** Claims one message until `until`; false when another sender has it or it was sent. */
    async claim(id: number, now: number, until: number): Promise<boolean> {
      const n = await scope
        .table('notification_outbox')
        .where('notification_outbox.id', id)
        .whereNull('notification_outbox.sent_at')
        .where((w) => w.whereNull('notification_outbox.claimed_until').orWhere('notification_outbox.claimed_until', '<', now))
        .update({ claimed_until: until });
      return n === 1;
    },
    async markSent(id: number, at: number): Promise<void> {
      await scope.table('notification_outbox').where('notification_outbox.id', id).update({ sent_at: at, claimed_until: null, last_error: null });
    },
    async markFailed(id: number, attempts: number, nextAttemptAt: number, error: string): Promise<void> {
      await scope
        .table('notification_outbox')
        .where('notification_outbox.id', id)
        .update({ attempts, next_attempt_at: nextAttemptAt, claimed_until: null, last_error: error.slice(0, 255) });
    },
  };
}

export type OutboxRepo = ReturnType<typeof outboxRepo>;
