import { createSecretFormat, hashSecret } from './secret-format.ts';

/** Ingest keys: `lbk_<12 hex prefix>_<43 base64url secret>` (see `createSecretFormat`). */
const format = createSecretFormat('lbk');

export const INGEST_KEY_PATTERN = format.pattern;

export function newIngestKey(): { key: string; prefix: string; hash: string } {
  const { secret, prefix, hash } = format.make();
  return { key: secret, prefix, hash };
}

export const hashIngestKey = hashSecret;
export const ingestKeyPrefix = format.prefixOf;
export const ingestKeyMatches = format.matches;
