/**
 * Words the members screens write themselves (confirmations before removing or leaving). This
 * file is the one place to review how the members feature speaks to people; field labels the
 * server shares live in `@shared/contract/words/members.ts`, role names in
 * `@shared/policies/permissions.ts` (ROLE_LABELS), never the stored role values.
 */

/** Question before an admin removes a member. */
export const removeMemberQuestion = (name: string): string => `Remove ${name} from this lab?`;

/** Question before a member leaves a lab. */
export const leaveLabQuestion = (labName: string): string => `Leave ${labName}? You will lose access until someone invites you again.`;
