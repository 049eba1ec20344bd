import type { Role } from '../policies/permissions.ts';

/**
 * The lab a request acts in, resolved by the lab guard from the URL's slug after checking
 * that the signed-in person is a member. Services receive it instead of a raw tenant id.
 */
export interface LabContext {
  id: number;
  slug: string;
  name: string;
  /** Plain text the admins wrote about the lab ('' when none). */
  description: string;
  createdAt: Date;
  /** The signed-in person's role in this lab. */
  role: Role;
}

/** The acting person, as services need them. */
export interface Actor {
  id: number;
  email: string;
  emailVerified: boolean;
  displayName: string;
}
