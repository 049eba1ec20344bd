import { createSecretFormat, hashSecret } from './secret-format.ts';

/** Personal API tokens: `lbt_<12 hex prefix>_<43 base64url secret>` (see `createSecretFormat`). */
const format = createSecretFormat('lbt');

export const PERSONAL_TOKEN_PATTERN = format.pattern;

export function newPersonalToken(): { token: string; prefix: string; hash: string } {
  const { secret, prefix, hash } = format.make();
  return { token: secret, prefix, hash };
}

export const hashPersonalToken = hashSecret;
export const personalTokenPrefix = format.prefixOf;
export const personalTokenMatches = format.matches;
