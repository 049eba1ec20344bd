import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Ingest keys look like `lbk_<12 hex prefix>_<43 base64url secret>` (256 random bits of
 * secret from the OS CSPRNG). The prefix is public and finds the key; only the SHA-256 of the
 * whole key is stored, so a database leak reveals no usable key.
 */
export const INGEST_KEY_PATTERN = /^lbk_([0-9a-f]{12})_([A-Za-z0-9_-]{43})$/;

export function newIngestKey(): { key: string; prefix: string; hash: string } {
  const prefix = randomBytes(6).toString('hex');
  const key = `lbk_${prefix}_${randomBytes(32).toString('base64url')}`;
  return { key, prefix, hash: hashIngestKey(key) };
}

export function hashIngestKey(key: string): string {
  return createHash('sha256').update(key).digest('hex');
}

/** The prefix of a well-formed key, or null. */
export function ingestKeyPrefix(key: string): string | null {
  return INGEST_KEY_PATTERN.exec(key)?.[1] ?? null;
}

/** Constant-time comparison of a presented key with a stored hash. */
export function ingestKeyMatches(key: string, storedHash: string): boolean {
  const a = Buffer.from(hashIngestKey(key), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}
