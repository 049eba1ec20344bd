import { createHash, randomBytes } from 'node:crypto';
import type { Request } from 'express';
import OpenIDConnectStrategy from 'passport-openidconnect';

const VERIFIER_KEY = 'lagbookPkceVerifier';

type SessionWithVerifier = Record<string, unknown> & { [VERIFIER_KEY]?: string };

/**
 * passport-openidconnect with PKCE (RFC 7636, S256).
 *
 * The library sends state and nonce but no code challenge. Passport runs each request on a
 * fresh `Object.create(strategy)`, so per-request fields set here never leak between
 * requests: at the authorization step a verifier is made, kept in the session and its
 * challenge added to the authorization request; at the callback the verifier is taken out
 * of the session (single use) and added to the token request.
 */
export class PkceOidcStrategy extends OpenIDConnectStrategy {
  private pendingChallenge: string | undefined;

  override authenticate(req: Request, options?: object): void {
    const session = req.session as unknown as SessionWithVerifier | undefined;
    if (session && req.query?.code) {
      const verifier = session[VERIFIER_KEY];
      delete session[VERIFIER_KEY];
      const self = this as unknown as { _oauth2: { getOAuthAccessToken: (code: string, params: object, cb: unknown) => void } };
      const shared = self._oauth2;
      const perRequest = Object.create(shared);
      perRequest.getOAuthAccessToken = function (this: unknown, code: string, params: object, cb: unknown) {
        return shared.getOAuthAccessToken.call(this, code, verifier ? { ...params, code_verifier: verifier } : params, cb);
      };
      self._oauth2 = perRequest;
    } else if (session && !req.query?.error) {
      const verifier = randomBytes(32).toString('base64url');
      session[VERIFIER_KEY] = verifier;
      this.pendingChallenge = createHash('sha256').update(verifier).digest('base64url');
    }
    super.authenticate(req, options);
  }

  override authorizationParams(options: object): object {
    const base = super.authorizationParams(options) as Record<string, string>;
    if (!this.pendingChallenge) return base;
    return { ...base, code_challenge: this.pendingChallenge, code_challenge_method: 'S256' };
  }
}
