import type { PersonalTokenInfo } from '../../db/personal-tokens.repo.ts';
import type { IssuedPersonalToken } from '../../services/personal-tokens.service.ts';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

/** Token metadata only: the secret is never shown again after it is made. */
export function presentPersonalToken(t: PersonalTokenInfo) {
  return {
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: iso(t.createdAt),
    expiresAt: iso(t.expiresAt),
    lastUsedAt: iso(t.lastUsedAt),
    revokedAt: iso(t.revokedAt),
  };
}

/** The answer to "make a token": the whole token, this once, and its metadata. */
export function presentIssuedPersonalToken(issued: IssuedPersonalToken) {
  return { token: issued.token, tokenInfo: presentPersonalToken(issued.info), shownOnce: true };
}
