import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/** SHA-256 of a secret, hex: all the database ever keeps of a key, token or link secret. */
export function hashSecret(secret: string): string {
  return createHash('sha256').update(secret).digest('hex');
}

/**
 * The shape of Lagbook's bearer secrets: `<head>_<12 hex prefix>_<43 base64url secret>`, 48
 * random bits of public prefix and 256 random bits of secret from the OS CSPRNG. The prefix
 * finds the stored row; only the SHA-256 of the whole string is stored, so a database leak
 * reveals nothing usable. The head tells kinds apart at a glance (`lbk` ingest keys, `lbt`
 * personal tokens).
 */
export function createSecretFormat(head: string) {
  const pattern = new RegExp(`^${head}_([0-9a-f]{12})_([A-Za-z0-9_-]{43})$`);
  return {
    pattern,
    /** A new secret with its public prefix and the hash to store. */
    make(): { secret: string; prefix: string; hash: string } {
      const prefix = randomBytes(6).toString('hex');
      const secret = `${head}_${prefix}_${randomBytes(32).toString('base64url')}`;
      return { secret, prefix, hash: hashSecret(secret) };
    },
    /** The prefix of a well-formed secret of this kind, or null. */
    prefixOf(secret: string): string | null {
      return pattern.exec(secret)?.[1] ?? null;
    },
    /** Constant-time comparison of a presented secret with a stored hash. */
    matches(secret: string, storedHash: string): boolean {
      const a = Buffer.from(hashSecret(secret), 'hex');
      const b = Buffer.from(storedHash, 'hex');
      return a.length === b.length && timingSafeEqual(a, b);
    },
  };
}
