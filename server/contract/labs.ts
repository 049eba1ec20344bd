import { z } from 'zod';
import type { Permission, Role } from '../policies/permissions.ts';
import type { IsoTime } from './common.ts';

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
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lowercase letters, digits and single hyphens');

/** `POST /api/v1/labs`; without `slug`, the address is derived from the name (slugFromName). */
export const createLabSchema = z.object({
  name: z.string().trim().min(2, 'must be at least 2 characters').max(120, 'must be at most 120 characters'),
  slug: labSlugSchema.optional(),
});
export type CreateLabInput = z.infer<typeof createLabSchema>;

// The client's create-lab form previews the slug the server will derive.
export { slugFromName } from '../policies/lab-slug.ts';

/** `GET /api/v1/labs/:lab`: the lab, the member's role and what that role may do. */
export interface LabDetail {
  lab: { slug: string; name: string; createdAt: IsoTime };
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
