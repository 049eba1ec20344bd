import { z } from 'zod';
import { ConfigError } from '../../errors.ts';

const discoverySchema = z.object({
  issuer: z.string(),
  authorization_endpoint: z.url(),
  token_endpoint: z.url(),
  userinfo_endpoint: z.url(),
  end_session_endpoint: z.url().optional(),
  code_challenge_methods_supported: z.array(z.string()).optional(),
});

export type OidcEndpoints = z.infer<typeof discoverySchema>;

/**
 * Reads the issuer's discovery document (OpenID Connect Discovery 1.0 §4), so that any
 * standard provider works from three settings: issuer, client id and secret. The document's
 * `issuer` must equal the configured issuer exactly (§4.3), or sign-in would fail later.
 */
export async function discoverOidcEndpoints(issuer: string, fetchImpl: typeof fetch = fetch): Promise<OidcEndpoints> {
  const url = `${issuer}/.well-known/openid-configuration`;
  let body: unknown;
  try {
    const res = await fetchImpl(url, { signal: AbortSignal.timeout(5000) });
    if (!res.ok) throw new Error(`HTTP ${res.status}`);
    body = await res.json();
  } catch (err) {
    throw new ConfigError(
      `The identity provider at ${issuer} did not answer its discovery document (${url}): ${(err as Error).message}. ` +
        'Check OIDC_ISSUER, or start the local provider with docker-free-scripts.',
    );
  }
  const parsed = discoverySchema.safeParse(body);
  if (!parsed.success) throw new ConfigError(`The discovery document at ${url} is not a valid OpenID Provider configuration.`);
  if (parsed.data.issuer !== issuer) {
    throw new ConfigError(`OIDC_ISSUER is "${issuer}" but the provider calls itself "${parsed.data.issuer}"; they must match exactly.`);
  }
  return parsed.data;
}
