import type { PersonalTokenInfo } from '../../db/personal-tokens.repo.ts';
import type { IssuedPersonalToken } from '../../services/personal-tokens.service.ts';
import type { IssuedToken, PersonalToken } from '../../contract/tokens.ts';
import { isoTime } from '../presenters/iso-time.ts';

/** Token metadata only: the secret is never shown again after it is made. */
export function presentPersonalToken(t: PersonalTokenInfo): PersonalToken {
  return {
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: isoTime(t.createdAt),
    expiresAt: isoTime(t.expiresAt),
    lastUsedAt: isoTime(t.lastUsedAt),
    revokedAt: isoTime(t.revokedAt),
  };
}

/** The answer to "make a token": the whole token, this once, and its metadata. */
export function presentIssuedPersonalToken(issued: IssuedPersonalToken): IssuedToken {
  return { token: issued.token, tokenInfo: presentPersonalToken(issued.info), shownOnce: true };
}
