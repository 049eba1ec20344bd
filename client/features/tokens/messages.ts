/**
 * Words the personal-token screens write themselves (confirmations, empty states). This file is
 * the one place to review how the tokens feature speaks to people; field labels the server
 * shares live in `@shared/contract/words/tokens.ts`.
 */

export const TOKENS_MESSAGES = {
  none: 'No tokens yet: make one for a notebook or a script.',
} as const;

/** Question before a token is revoked (named as its maker named it). */
export const revokeTokenQuestion = (tokenName: string): string => `Revoke “${tokenName}”? Scripts using it are refused from now on.`;
