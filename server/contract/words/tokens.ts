/** Words of personal API tokens: field labels, shared by the contract, the service and the client. */

/** Fields of `POST /api/v1/me/tokens`. */
export const TOKEN_LABELS = {
  name: 'Token name',
  expiresInDays: 'Valid for (days)',
  tokenId: 'Token',
} as const;

/** Reasons the tokens area's own checks give. */
export const TOKEN_REASONS = {
  expiresMax: 'must be at most 365 days',
  expiresMin: 'must be at least 1 day',
} as const;
