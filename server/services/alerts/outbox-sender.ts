import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { outboxRepo } from '../../db/notification-outbox.repo.ts';
import { retryTransaction } from '../../db/retry-transaction.ts';
import { isDatabaseUnavailable, isLockConflict, isNodeNotReady } from '../../db/db-errors.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { retryDelayMs } from './retry-delay.ts';

/** How long a claimed message is reserved for its sender (after that another may try it). */
export const CLAIM_MS = 120_000;

/** Retries of marking a sent message: long enough to outlast a writer failover (4–5 s measured on the cluster). */
export const MARK_SENT_RETRY = {
  attempts: 8,
  baseMs: 500,
  capMs: 4000,
  retryWhen: (err: unknown) => isLockConflict(err) || isDatabaseUnavailable(err) || isNodeNotReady(err),
} as const;

/** What one pass of the sender did. */
export interface SendSummary {
  sent: number;
  failed: number;
}

/**
 * Sends one lab's due alert mail from the outbox: claims each message (so two senders never
 * send the same one), hands it to SMTP, marks it sent. A failure keeps the message with the
 * error and its next attempt after {@link retryDelayMs}. Exactly once on the normal path and
 * through a database failover (marking sent is retried, {@link MARK_SENT_RETRY}); if the process
 * itself dies after the SMTP server accepted a message and before it is marked sent, the claim
 * expires and the message goes out a second time (at most once more): SMTP offers no way to make
 * the hand-over and the mark one step.
 */
export async function sendDueMail(deps: { db: Db; mailer: Mailer; logger: LogWriter }, tenantId: number, now: number, limit = 100): Promise<SendSummary> {
  const outbox = outboxRepo(inLab(deps.db, tenantId));
  const summary: SendSummary = { sent: 0, failed: 0 };
  for (const message of await outbox.due(now, limit)) {
    if (!(await outbox.claim(message.id, now, now + CLAIM_MS))) continue;
    try {
      await deps.mailer.send({ to: message.to, subject: message.subject, text: message.text, html: message.html || undefined });
    } catch (err) {
      const attempts = message.attempts + 1;
      await outbox.markFailed(message.id, attempts, now + retryDelayMs(attempts), (err as Error).message ?? String(err));
      deps.logger.warn('alert mail not sent; will retry', { tenantId, outboxId: message.id, attempts, error: (err as Error).message });
      summary.failed++;
      continue;
    }
    // The mail has left: record it even through a database failover (about 10–20 s of jittered
    // retries), or the claim would expire and the same mail would go out again. Marking sent is one
    // idempotent UPDATE, so repeating it after an attempt that did commit changes nothing.
    await retryTransaction(() => outbox.markSent(message.id, now), MARK_SENT_RETRY);
    summary.sent++;
  }
  return summary;
}
