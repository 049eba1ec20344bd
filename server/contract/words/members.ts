/**
 * Words of the members and invitations areas: field labels and the reasons their checks give.
 * Shared by the contract, the members and invitations services and the client.
 */

/** Fields of inviting someone and of changing a member's role. */
export const MEMBER_LABELS = {
  email: 'E-mail address',
  role: 'Role',
  userId: 'Member',
  id: 'Invitation',
} as const;

/** Reasons the members area's own checks give. */
export const MEMBER_REASONS = {
  alreadyPending: 'an invitation to this address is already waiting',
  alreadyMember: 'this person is already a member of the lab',
} as const;
