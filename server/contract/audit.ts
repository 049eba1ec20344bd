import { z } from 'zod';
import type { IsoTime } from './common.ts';
import { REASONS } from './words/reasons.ts';

/** A lab's audit log: the actions it records, the filters admins read it with, and its entries. */

/** Every action the audit log records: the services write these, the client's filter offers them. */
export const AUDIT_ACTIONS = [
  'lab.created',
  'lab.updated',
  'lab.exported',
  'invitation.created',
  'invitation.resent',
  'invitation.revoked',
  'invitation.accepted',
  'member.role-changed',
  'member.removed',
  'member.left',
  'logger.registered',
  'logger.updated',
  'logger.retired',
  'channel.added',
  'channel.updated',
  'channel.retired',
  'ingest-key.issued',
  'ingest-key.rotated',
  'ingest-key.revoked',
  'logger.test-reading',
  'logger.test-reading-removed',
  'logger.uploaded',
  'quarantine.discarded',
  'quarantine.resubmitted',
  'quarantine.bulk-reread',
  'quarantine.bulk-shifted',
  'quarantine.bulk-channel-mapped',
  'quarantine.bulk-discarded',
  'alert-rule.created',
  'alert-rule.updated',
  'alert-rule.deleted',
  'alert.acknowledged',
  'token.created',
  'token.revoked',
  'billing.checkout-started',
  'billing.plan-change-requested',
  'billing.plan-changed',
  'billing.status-changed',
  'note.created',
  'note.updated',
  'note.deleted',
  'note-kind.created',
  'note-kind.updated',
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** `GET …/audit`: filters (all optional) and the page asked for. */
export const auditQuerySchema = z.object({
  action: z.string().max(64).optional(),
  actor: z.string().trim().max(191).optional(),
  from: z.iso.datetime({ offset: true, error: REASONS.isoTime }).optional(),
  to: z.iso.datetime({ offset: true, error: REASONS.isoTime }).optional(),
  page: z.coerce.number().int().min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce.number().int().min(1, 'must be 1 or more').max(200, 'must be at most 200').default(50),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

/** One entry of the audit log; `actor` is null for an operator's action or a deleted account. */
export interface AuditEntry {
  id: number;
  at: IsoTime;
  actor: { name: string; email: string } | null;
  /** One of AUDIT_ACTIONS (typed as a string: the log keeps what was recorded). */
  action: string;
  /** What happened, in our own plain words (server/contract/words/audit.ts). */
  sentence: string;
  /** The summary as recorded (older entries may name raw payment events). */
  summary: string;
  details: Record<string, unknown> | null;
}

/** `GET …/audit`: one page of the log, newest first, with the total for the pager. */
export interface AuditPage {
  entries: AuditEntry[];
  total: number;
  page: number;
  pageSize: number;
}
