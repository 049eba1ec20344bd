import type { AuditAction } from '@shared/contract/audit.ts';

/**
 * Words the audit log screens write themselves: how each recorded action reads in the filter and
 * the log. This file is the one place to review how the audit feature speaks to people; field
 * labels the server shares live in `@shared/contract/words/audit.ts` and the sentences of the
 * entries in the server's audit words.
 */

/** How each audit action reads in the log and in the filter. */
export const AUDIT_ACTION_LABELS: Record<AuditAction, string> = {
  'lab.created': 'Lab created',
  'lab.updated': 'Lab renamed or described',
  'lab.exported': 'Full lab export downloaded',
  'invitation.created': 'Invitation sent',
  'invitation.resent': 'Invitation sent again',
  'invitation.revoked': 'Invitation revoked',
  'invitation.accepted': 'Invitation accepted',
  'member.role-changed': 'Role changed',
  'member.removed': 'Member removed',
  'member.left': 'Member left',
  'logger.registered': 'Logger registered',
  'logger.updated': 'Logger edited',
  'logger.retired': 'Logger retired',
  'channel.added': 'Channel added',
  'channel.updated': 'Channel edited',
  'channel.retired': 'Channel retired',
  'ingest-key.issued': 'Ingest key issued',
  'ingest-key.rotated': 'Ingest key replaced',
  'ingest-key.revoked': 'Ingest key revoked',
  'logger.test-reading': 'Test reading sent',
  'logger.test-reading-removed': 'Test reading removed',
  'logger.uploaded': 'History file uploaded',
  'quarantine.discarded': 'Quarantined rows discarded',
  'quarantine.resubmitted': 'Quarantined rows resubmitted',
  'quarantine.bulk-reread': 'Quarantined rows re-read in bulk',
  'quarantine.bulk-shifted': 'Quarantined rows shifted in bulk',
  'quarantine.bulk-channel-mapped': 'Quarantined rows mapped to a channel',
  'quarantine.bulk-discarded': 'Quarantined rows discarded in bulk',
  'alert-rule.created': 'Alert rule made',
  'alert-rule.updated': 'Alert rule changed',
  'alert-rule.deleted': 'Alert rule deleted',
  'alert.acknowledged': 'Alert acknowledged',
  'token.created': 'Personal API token created',
  'token.revoked': 'Personal API token revoked',
  'billing.checkout-started': 'Plan checkout started',
  'billing.plan-change-requested': 'Plan switch requested',
  'billing.plan-changed': 'Plan changed',
  'billing.status-changed': 'Payment status changed',
  'note.created': 'Note added',
  'note.updated': 'Note changed',
  'note.deleted': 'Note deleted',
  'note-kind.created': 'Note kind added',
  'note-kind.updated': 'Note kind changed',
};

/** What the log says for an action this client has no words for yet (its recorded name stays in the entry's details). */
export const OTHER_ACTION = 'Other action';

/** The label of an action, or {@link OTHER_ACTION} for one this client does not know yet: never the recorded name. */
export function auditActionLabel(action: string): string {
  return (AUDIT_ACTION_LABELS as Record<string, string>)[action] ?? OTHER_ACTION;
}
