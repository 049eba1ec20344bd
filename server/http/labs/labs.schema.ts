import { z } from 'zod';
import { roleSchema } from '../../contract/members.ts';

/**
 * Input schemas of the lab, member, invitation and audit routes. The client's forms import
 * these same schemas, so a form and the server never disagree about what is valid.
 * Pure zod: no server imports.
 */

export const labSlugSchema = z
  .string()
  .trim()
  .min(3, 'must be at least 3 characters')
  .max(48, 'must be at most 48 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lowercase letters, digits and single hyphens');

export const createLabSchema = z.object({
  name: z.string().trim().min(2, 'must be at least 2 characters').max(120, 'must be at most 120 characters'),
  slug: labSlugSchema.optional(),
});
export type CreateLabInput = z.infer<typeof createLabSchema>;


export const inviteMemberSchema = z.object({
  email: z.string().trim().toLowerCase().max(191, 'must be at most 191 characters').pipe(z.email('must be a valid e-mail address')),
  role: roleSchema,
});
export type InviteMemberInput = z.infer<typeof inviteMemberSchema>;


export const AUDIT_ACTIONS = [
  'lab.created',
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
  'quarantine.discarded',
  'quarantine.resubmitted',
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
] as const;

export const auditQuerySchema = z.object({
  action: z.string().max(64).optional(),
  actor: z.string().trim().max(191).optional(),
  from: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 date-time' }).optional(),
  to: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 date-time' }).optional(),
  page: z.coerce.number().int().min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce.number().int().min(1, 'must be 1 or more').max(200, 'must be at most 200').default(50),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

// The client's create-lab form previews the slug the server will derive.
export { slugFromName } from '../../policies/lab-slug.ts';
