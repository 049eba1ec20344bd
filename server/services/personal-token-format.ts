import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Personal API tokens look like `lbt_<12 hex prefix>_<43 base64url secret>`: 48 random bits of
 * public prefix and 256 random bits of secret, both from the OS CSPRNG. The prefix finds the
 * token; only the SHA-256 of the whole token is stored, so a database leak reveals no usable
 * token. The `lbt_` head tells them apart from ingest keys (`lbk_`) at a glance.
 */
export const PERSONAL_TOKEN_PATTERN = /^lbt_([0-9a-f]{12})_([A-Za-z0-9_-]{43})$/;

/** A new token with its public prefix and the hash to store. */
export function newPersonalToken(): { token: string; prefix: string; hash: string } {
  const prefix = randomBytes(6).toString('hex');
  const token = `lbt_${prefix}_${randomBytes(32).toString('base64url')}`;
  return { token, prefix, hash: hashPersonalToken(token) };
}

/** SHA-256 of the whole token, hex (what the database keeps). */
export function hashPersonalToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** The prefix of a well-formed token, or null (anything else is not a personal token). */
export function personalTokenPrefix(token: string): string | null {
  return PERSONAL_TOKEN_PATTERN.exec(token)?.[1] ?? null;
}

/** Constant-time comparison of a presented token with a stored hash. */
export function personalTokenMatches(token: string, storedHash: string): boolean {
  const a = Buffer.from(hashPersonalToken(token), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}
