import { z } from 'zod';
import type { Permission, Role } from '../policies/permissions.ts';
import type { IsoTime } from './common.ts';
import { LAB_REASONS } from './words/labs.ts';

/**
 * Labs: creating one and reading it as a member. Shared by the routes, the ops CLI and the
 * client's create-lab form, so a form and the server never disagree about what is valid.
 */

/** A lab's address: 3–48 lowercase letters and digits in groups joined by single hyphens. */
export const labSlugSchema = z
  .string()
  .trim()
  .min(3, 'must be at least 3 characters')
  .max(48, 'must be at most 48 characters')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, LAB_REASONS.slugForm);

/** A lab's name as people read it: 2–120 characters after trimming. */
export const labNameSchema = z.string().trim().min(2, 'must be at least 2 characters').max(120, 'must be at most 120 characters');

/** `POST /api/v1/labs`; without `slug`, the address is derived from the name (slugFromName). */
export const createLabSchema = z.object({
  name: labNameSchema,
  slug: labSlugSchema.optional(),
});
export type CreateLabInput = z.infer<typeof createLabSchema>;

// The client's create-lab form previews the slug the server will derive.
export { slugFromName } from '../policies/lab-slug.ts';

/** `GET /api/v1/labs/:lab`: the lab, the member's role and what that role may do. */
export interface LabDetail {
  lab: { slug: string; name: string; description: string; createdAt: IsoTime };
  role: Role;
  permissions: Permission[];
}

/**
 * `POST /api/v1/labs` (201): the new lab with the creator's role, and the address asked for;
 * `lab.slug` differs from `requestedSlug` when that one was unavailable and the lab got a variant.
 */
export interface CreatedLab {
  lab: { slug: string; name: string; role: 'admin' };
  requestedSlug: string;
}

/** Longest lab description (characters), as the `labs.description` column holds it. */
export const LAB_DESCRIPTION_MAX = 1000;

/** Control characters other than tab and line breaks: a description is plain text. */
// eslint-disable-next-line no-control-regex
const CONTROL_CHARACTERS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

/**
 * `PATCH /api/v1/labs/:lab` (admins): a new name, a new description, or both. The address
 * (slug) never changes, so links and bookmarks keep working.
 */
export const updateLabSchema = z
  .object({
    name: labNameSchema.optional(),
    description: z
      .string()
      .trim()
      .max(LAB_DESCRIPTION_MAX, `must be at most ${LAB_DESCRIPTION_MAX} characters`)
      .refine((d) => !CONTROL_CHARACTERS.test(d), LAB_REASONS.plainText)
      .optional(),
  })
  .refine((b) => b.name !== undefined || b.description !== undefined, { message: LAB_REASONS.nameOrDescription, path: ['name'] });
export type UpdateLabInput = z.infer<typeof updateLabSchema>;

/** `POST /api/v1/labs/:lab/deletion` (admins): the lab's name typed again, to confirm. */
export const deleteLabSchema = z.object({
  confirmName: z.string({ error: LAB_REASONS.confirmName }).max(200, 'must be at most 200 characters'),
});
export type DeleteLabInput = z.infer<typeof deleteLabSchema>;

/** `POST /api/v1/labs/:lab/deletion` (202): the lab is closed at once; its rows are removed in the background. */
export interface LabDeletionStarted {
  deletion: {
    labSlug: string;
    labName: string;
    requestedAt: IsoTime;
    /** Whether a Stripe subscription was cancelled (false: the lab had none running). */
    subscriptionCancelled: boolean;
  };
}

/** The format of `lab.json` inside a full export (`GET /api/v1/labs/:lab/export.zip`). */
export const LAB_EXPORT_FORMAT = 'lagbook-lab-export/1';

/** `lab.json` in a full export: the lab's settings (its readings are one CSV per channel beside it). */
export interface LabExportSettings {
  format: typeof LAB_EXPORT_FORMAT;
  exportedAt: IsoTime;
  lab: { slug: string; name: string; description: string; createdAt: IsoTime };
  members: Array<{ name: string; email: string; role: Role; joinedAt: IsoTime }>;
  loggers: Array<Record<string, unknown> & { id: number; name: string }>;
  channels: Array<Record<string, unknown> & { id: number; loggerId: number; key: string; readingsFile: string }>;
  alertRules: Array<Record<string, unknown> & { id: number; name: string }>;
  /** Present only when the notes service exists (time-range notes on channels and loggers). */
  notes?: Array<Record<string, unknown>>;
}
