import { generateKeyPairSync, randomUUID, type JsonWebKey } from 'node:crypto';

/** A private JSON Web Key (RFC 7517) with the members oidc-provider needs to sign ID tokens. */
export type SigningJwk = JsonWebKey & { kid: string; alg: 'RS256'; use: 'sig' };

/**
 * Generates a fresh 2048-bit RSA key for RS256 ID-token signatures (RFC 7518 §3.3 requires
 * at least 2048 bits). A new key per start is enough for a stand-in: relying parties fetch
 * the public half from the JWKS endpoint.
 */
export function generateSigningJwk(): SigningJwk {
  const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  return { ...privateKey.export({ format: 'jwk' }), kid: randomUUID(), alg: 'RS256', use: 'sig' };
}
