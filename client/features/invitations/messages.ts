/**
 * Words the invitation screens write themselves: what the acceptance page says about each way a
 * link can fail, confirmations and notices. This file is the one place to review how the
 * invitations feature speaks to people; field labels the server shares live in
 * `@shared/contract/words/members.ts`.
 */

/** What the acceptance page says about each way an invitation link can fail. */
export interface InvitationProblem {
  title: string;
  advice: string;
}

export const INVITATION_PROBLEMS: Record<string, InvitationProblem> = {
  invitation_not_found: {
    title: 'This invitation link does not work',
    advice: 'The link may be incomplete or mistyped. Open it again from the e-mail, or ask the person who invited you to resend it.',
  },
  invitation_expired: {
    title: 'This invitation has expired',
    advice: 'Invitation links work for 7 days. Ask an admin of the lab to resend it.',
  },
  invitation_used: {
    title: 'This invitation has already been used',
    advice: 'Each link works once. If it was you who accepted it, the lab is already in your list.',
  },
  invitation_revoked: {
    title: 'This invitation was withdrawn',
    advice: 'An admin of the lab revoked it. Ask them if you still expect to join.',
  },
  already_member: {
    title: 'You already belong to this lab',
    advice: 'There is nothing to accept: open the lab from your list.',
  },
};

/** The problem for an error code, or a general one for codes this client does not know. */
export function invitationProblem(code: string): InvitationProblem {
  return (
    INVITATION_PROBLEMS[code] ?? {
      title: 'This invitation cannot be opened right now',
      advice: 'Try again in a moment. If it keeps failing, ask the person who invited you.',
    }
  );
}

/** Notice after an invitation was sent. */
export const invitationSent = (email: string): string => `Invitation sent to ${email}. The link works for 7 days.`;

/** Question before an invitation is withdrawn. */
export const revokeInvitationQuestion = (email: string): string => `Revoke the invitation to ${email}?`;
