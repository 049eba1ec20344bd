import { z } from 'zod';
import type { Role } from '../policies/permissions.ts';
import { idParams, type IsoTime } from './common.ts';
import { roleSchema } from './members.ts';

/**
 * Invitations by e-mail: the admins' side (list, invite, resend, revoke) and the invited
 * person's side (preview the link, accept it). Shared by the routes, the services and the client.
 */

/** `POST …/invitations`: an address (stored lower-case) and the role it joins with. */
export const inviteMemberSchema = z.object({
  email: z.string().trim().toLowerCase().max(191, 'must be at most 191 characters').pipe(z.email('must be a valid e-mail address')),
  role: roleSchema,
});
export type InviteMemberInput = z.infer<typeof inviteMemberSchema>;

/** `…/invitations/:id` and `…/invitations/:id/resend`. */
export const invitationParams = idParams('id');

/**
 * `/api/v1/invitations/:lab/:token` (the link's parts). Any string is taken: an unknown lab or a
 * malformed secret answers the same 404 `invitation_not_found` as an unknown secret.
 */
export const invitationLinkParams = z.object({ lab: z.string(), token: z.string() });

/** A pending invitation as admins see it; the secret never leaves the server after the e-mail. */
export interface PendingInvitation {
  id: number;
  email: string;
  role: Role;
  /** Null when the inviting account no longer exists. */
  invitedBy: { name: string; email: string } | null;
  createdAt: IsoTime;
  expiresAt: IsoTime;
  lastSentAt: IsoTime;
}

/** `GET …/invitations`. */
export interface PendingInvitationsAnswer {
  invitations: PendingInvitation[];
}

/** `POST …/invitations` (201) and `POST …/invitations/:id/resend`. */
export interface InvitationAnswer {
  invitation: PendingInvitation;
}

/** `GET /api/v1/invitations/:lab/:token`: what the link offers, for the acceptance page. */
export interface InvitationPreview {
  invitation: {
    lab: { slug: string; name: string };
    role: Role;
    email: string;
    /** Null when the inviting account no longer exists. */
    invitedBy: { name: string } | null;
    expiresAt: IsoTime;
  };
  /** Whether the signed-in person's verified e-mail is the invited address. */
  matchesSignedInUser: boolean;
}

/** `POST /api/v1/invitations/:lab/:token/accept`: the lab joined and the role taken. */
export interface AcceptedInvitation {
  lab: { slug: string; name: string };
  role: Role;
}
