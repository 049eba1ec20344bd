import { createHash, createPublicKey, randomBytes, verify, type JsonWebKey } from 'node:crypto';
import { CookieJar } from 'tough-cookie';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';
import { IDENTITY_PROVIDER_PATHS, startIdentityProvider, type RunningIdentityProvider } from './identity-provider.ts';
import { WRONG_CREDENTIALS_MESSAGE } from './interaction-routes.ts';

// Expectations follow OpenID Connect Core 1.0 (§3.1 authorization-code flow, §3.1.3.7 ID token
// validation, §5.3 UserInfo) and RFC 7636 (PKCE): a test double of the lab's sign-in is only
// useful if it behaves as those specifications say a real provider does.

const CLIENT = {
  clientId: 'lagbook-test',
  clientSecret: 'lagbook-test-secret-0123456789',
  redirectUris: ['http://127.0.0.1:9/auth/callback'],
};
const [SCIENTIST] = DEV_ACCOUNTS.filter((account) => account.role === 'scientist');

let idp: RunningIdentityProvider;

beforeAll(async () => {
  idp = await startIdentityProvider({ port: 0, clients: [CLIENT] });
});

afterAll(async () => {
  await idp?.close();
});

/** RFC 7636 §4.2: code_challenge = BASE64URL(SHA256(ASCII(code_verifier))). */
function s256(verifier: string): string {
  return createHash('sha256').update(verifier, 'ascii').digest('base64url');
}

function decodeJwtPart(part: string): Record<string, unknown> {
  return JSON.parse(Buffer.from(part, 'base64url').toString('utf8')) as Record<string, unknown>;
}

/** A scripted user agent: fetch with a cookie jar, following redirects by hand until the client's callback. */
class ScriptedBrowser {
  private readonly jar = new CookieJar();

  async request(url: string, init: { method?: string; form?: Record<string, string> } = {}): Promise<Response> {
    const headers: Record<string, string> = {};
    const cookie = await this.jar.getCookieString(url);
    if (cookie) headers.cookie = cookie;
    let body: URLSearchParams | undefined;
    if (init.form) body = new URLSearchParams(init.form);
    const response = await fetch(url, { method: init.method ?? 'GET', headers, body, redirect: 'manual' });
    for (const setCookie of response.headers.getSetCookie()) await this.jar.setCookie(setCookie, url);
    return response;
  }

  /** Sends the request, then follows redirects; stops at the relying party's redirect URI without fetching it. */
  async follow(url: string, init: { method?: string; form?: Record<string, string> } = {}): Promise<{ url: string; response?: Response }> {
    let response = await this.request(url, init);
    let current = url;
    for (let hops = 0; hops < 10; hops += 1) {
      const location = response.headers.get('location');
      if (response.status < 300 || response.status >= 400 || !location) return { url: current, response };
      current = new URL(location, current).toString();
      if (current.startsWith(CLIENT.redirectUris[0])) return { url: current };
      response = await this.request(current);
    }
    throw new Error(`too many redirects, last at ${current}`);
  }
}

function formAction(html: string, formId: string, base: string): string {
  const tag = new RegExp(`<form[^>]*id="${formId.replace('.', '\\.')}"[^>]*>`).exec(html)?.[0];
  const match = tag ? /action="([^"]+)"/.exec(tag) : null;
  if (!match) throw new Error(`form #${formId} not found in page`);
  return new URL(match[1], base).toString();
}

interface AuthorizationStart {
  browser: ScriptedBrowser;
  verifier: string;
  state: string;
  nonce: string;
  loginPageUrl: string;
  loginHtml: string;
}

async function startAuthorization(): Promise<AuthorizationStart> {
  const browser = new ScriptedBrowser();
  const verifier = randomBytes(32).toString('base64url');
  const state = randomBytes(12).toString('base64url');
  const nonce = randomBytes(12).toString('base64url');
  const authorize = new URL(IDENTITY_PROVIDER_PATHS.authorization, idp.issuer);
  authorize.search = new URLSearchParams({
    client_id: CLIENT.clientId,
    response_type: 'code',
    redirect_uri: CLIENT.redirectUris[0],
    scope: 'openid email profile',
    state,
    nonce,
    code_challenge: s256(verifier),
    code_challenge_method: 'S256',
  }).toString();
  const { url, response } = await browser.follow(authorize.toString());
  expect(response?.status).toBe(200);
  const loginHtml = await response!.text();
  expect(loginHtml).toContain('<label for="email">');
  expect(loginHtml).toContain('<label for="password">');
  return { browser, verifier, state, nonce, loginPageUrl: url, loginHtml };
}

async function signIn(start: AuthorizationStart, email: string, password: string) {
  return start.browser.follow(formAction(start.loginHtml, 'sign-in', start.loginPageUrl), {
    method: 'POST',
    form: { email, password },
  });
}

/** Runs login and consent; returns the redirect URI the provider sent the browser to. */
async function signInAndAllow(start: AuthorizationStart): Promise<URL> {
  const consent = await signIn(start, SCIENTIST.email, SCIENTIST.password);
  expect(consent.response?.status).toBe(200);
  const consentHtml = await consent.response!.text();
  expect(consentHtml).toContain('Allow');
  expect(consentHtml).toContain(SCIENTIST.email);
  const done = await start.browser.follow(formAction(consentHtml, 'allow', consent.url), { method: 'POST' });
  return new URL(done.url);
}

function basicAuth(): string {
  const encode = (value: string) => encodeURIComponent(value);
  return `Basic ${Buffer.from(`${encode(CLIENT.clientId)}:${encode(CLIENT.clientSecret)}`).toString('base64')}`;
}

async function redeemCode(code: string, verifier: string, auth: 'basic' | 'post' = 'basic'): Promise<Response> {
  const form: Record<string, string> = {
    grant_type: 'authorization_code',
    code,
    redirect_uri: CLIENT.redirectUris[0],
    code_verifier: verifier,
  };
  const headers: Record<string, string> = {};
  if (auth === 'basic') headers.authorization = basicAuth();
  else Object.assign(form, { client_id: CLIENT.clientId, client_secret: CLIENT.clientSecret });
  return fetch(new URL(IDENTITY_PROVIDER_PATHS.token, idp.issuer), { method: 'POST', headers, body: new URLSearchParams(form) });
}

describe('identity provider stand-in', () => {
  it('computes S256 challenges as RFC 7636 Appendix B does', () => {
    // RFC 7636 Appendix B example verifier and challenge.
    expect(s256('dBjftJeZ4CVP-mB92K27uhbUJU1p1r_wW1gFWFOEjXk')).toBe('E9Melhoa2OwvFrEMTJguCHaoeK1t8URWbuGJSstw-cM');
  });

  it('publishes an issuer without trailing slash and the exported endpoint paths (OpenID Connect Discovery 1.0 §3)', async () => {
    expect(idp.issuer).toBe(`http://127.0.0.1:${idp.port}`);
    const response = await fetch(`${idp.issuer}/.well-known/openid-configuration`);
    const metadata = (await response.json()) as Record<string, unknown>;
    expect(metadata.issuer).toBe(idp.issuer);
    expect(metadata.authorization_endpoint).toBe(idp.issuer + IDENTITY_PROVIDER_PATHS.authorization);
    expect(metadata.token_endpoint).toBe(idp.issuer + IDENTITY_PROVIDER_PATHS.token);
    expect(metadata.userinfo_endpoint).toBe(idp.issuer + IDENTITY_PROVIDER_PATHS.userinfo);
    expect(metadata.jwks_uri).toBe(idp.issuer + IDENTITY_PROVIDER_PATHS.jwks);
    expect(metadata.end_session_endpoint).toBe(idp.issuer + IDENTITY_PROVIDER_PATHS.endSession);
    expect(metadata.code_challenge_methods_supported).toEqual(['S256']);
    expect(metadata.token_endpoint_auth_methods_supported).toEqual(expect.arrayContaining(['client_secret_basic', 'client_secret_post']));
  });

  it('runs the authorization-code flow with PKCE to a signed ID token and UserInfo claims', async () => {
    const start = await startAuthorization();
    const callback = await signInAndAllow(start);
    expect(callback.origin + callback.pathname).toBe(CLIENT.redirectUris[0]);
    expect(callback.searchParams.get('state')).toBe(start.state);
    const code = callback.searchParams.get('code');
    expect(code).toBeTruthy();

    const tokenResponse = await redeemCode(code!, start.verifier);
    expect(tokenResponse.status).toBe(200);
    const tokens = (await tokenResponse.json()) as { id_token: string; access_token: string; token_type: string };
    expect(tokens.token_type).toBe('Bearer');

    // OpenID Connect Core 1.0 §3.1.3.7: iss must equal the issuer, aud contain the client id, nonce match.
    const [header, payload, signature] = tokens.id_token.split('.');
    const claims = decodeJwtPart(payload);
    expect(claims.iss).toBe(idp.issuer);
    expect(claims.aud).toBe(CLIENT.clientId);
    expect(claims.nonce).toBe(start.nonce);
    expect(claims.sub).toBe(SCIENTIST.sub);
    const { alg, kid } = decodeJwtPart(header) as { alg: string; kid: string };
    expect(alg).toBe('RS256');

    // §3.1.3.7 item 6: the signature verifies with the provider's published key.
    const jwks = (await (await fetch(idp.issuer + IDENTITY_PROVIDER_PATHS.jwks)).json()) as { keys: Array<JsonWebKey & { kid: string }> };
    const jwk = jwks.keys.find((key) => key.kid === kid);
    expect(jwk).toBeDefined();
    expect(jwk).not.toHaveProperty('d');
    const signed = Buffer.from(`${header}.${payload}`);
    const publicKey = createPublicKey({ key: jwk!, format: 'jwk' });
    expect(verify('sha256', signed, publicKey, Buffer.from(signature, 'base64url'))).toBe(true);
    expect(verify('sha256', Buffer.from(`${header}.${payload}x`), publicKey, Buffer.from(signature, 'base64url'))).toBe(false);

    // §5.3: UserInfo returns the claims of the granted scopes; §5.1 email_verified is a boolean.
    const userinfo = await fetch(idp.issuer + IDENTITY_PROVIDER_PATHS.userinfo, {
      headers: { authorization: `Bearer ${tokens.access_token}` },
    });
    expect(userinfo.status).toBe(200);
    expect(await userinfo.json()).toEqual({
      sub: SCIENTIST.sub,
      email: SCIENTIST.email,
      email_verified: true,
      name: SCIENTIST.name,
    });
  });

  it('accepts client_secret_post at the token endpoint as well (OpenID Connect Core 1.0 §9)', async () => {
    const start = await startAuthorization();
    const callback = await signInAndAllow(start);
    const response = await redeemCode(callback.searchParams.get('code')!, start.verifier, 'post');
    expect(response.status).toBe(200);
    expect(await response.json()).toHaveProperty('id_token');
  });

  it('refuses a wrong code_verifier with invalid_grant (RFC 7636 §4.6)', async () => {
    const start = await startAuthorization();
    const callback = await signInAndAllow(start);
    const response = await redeemCode(callback.searchParams.get('code')!, randomBytes(32).toString('base64url'));
    expect(response.status).toBe(400);
    expect(await response.json()).toMatchObject({ error: 'invalid_grant' });
  });

  it('re-renders the login form with 401 and a clear message for a wrong password, escaping what it echoes', async () => {
    const start = await startAuthorization();
    const wrong = await signIn(start, SCIENTIST.email, 'not-the-password');
    expect(wrong.response?.status).toBe(401);
    const html = await wrong.response!.text();
    expect(html).toContain(WRONG_CREDENTIALS_MESSAGE.replace("'", '&#39;'));
    expect(html).toContain(`value="${SCIENTIST.email}"`);

    const hostile = await signIn(start, '"><script>alert(1)</script>', 'x');
    expect(hostile.response?.status).toBe(401);
    const hostileHtml = await hostile.response!.text();
    expect(hostileHtml).not.toContain('<script>alert(1)</script>');
    expect(hostileHtml).toContain('&quot;&gt;&lt;script&gt;alert(1)&lt;/script&gt;');

    // The interaction is still alive: the right password then proceeds to consent.
    const retry = await signIn(start, SCIENTIST.email.toUpperCase(), SCIENTIST.password);
    expect(retry.response?.status).toBe(200);
    expect(await retry.response!.text()).toContain('Deny');
  });

  it('ends with error=access_denied when the person cancels the login (OpenID Connect Core 1.0 §3.1.2.6)', async () => {
    const start = await startAuthorization();
    const done = await start.browser.follow(formAction(start.loginHtml, 'cancel', start.loginPageUrl), { method: 'POST' });
    const callback = new URL(done.url);
    expect(callback.origin + callback.pathname).toBe(CLIENT.redirectUris[0]);
    expect(callback.searchParams.get('error')).toBe('access_denied');
    expect(callback.searchParams.get('state')).toBe(start.state);
    expect(callback.searchParams.has('code')).toBe(false);
  });

  it('ends with error=access_denied when the person denies consent', async () => {
    const start = await startAuthorization();
    const consent = await signIn(start, SCIENTIST.email, SCIENTIST.password);
    const consentHtml = await consent.response!.text();
    const done = await start.browser.follow(formAction(consentHtml, 'deny', consent.url), { method: 'POST' });
    const callback = new URL(done.url);
    expect(callback.searchParams.get('error')).toBe('access_denied');
    expect(callback.searchParams.get('state')).toBe(start.state);
    expect(callback.searchParams.has('code')).toBe(false);
  });

  it('renders its own error page for an unknown client', async () => {
    const unknownClient = new URL(IDENTITY_PROVIDER_PATHS.authorization, idp.issuer);
    unknownClient.search = new URLSearchParams({ client_id: 'nobody', response_type: 'code', scope: 'openid' }).toString();
    const error = await fetch(unknownClient);
    expect(error.status).toBe(400);
    const errorHtml = await error.text();
    expect(errorHtml).toContain('The sign-in request could not be completed');
    expect(errorHtml).toContain('invalid_client');
  });

  it('signs out through its own confirmation page (OpenID Connect RP-Initiated Logout 1.0)', async () => {
    const start = await startAuthorization();
    await signInAndAllow(start);
    const endSession = idp.issuer + IDENTITY_PROVIDER_PATHS.endSession;
    const confirm = await start.browser.request(endSession);
    expect(confirm.status).toBe(200);
    const confirmHtml = await confirm.text();
    expect(confirmHtml).toContain('Sign out of the stand-in?');
    expect(confirmHtml).not.toMatch(/https?:\/\/(?!127\.0\.0\.1)/);
    const xsrf = /name="xsrf" value="([^"]+)"/.exec(confirmHtml)?.[1];
    expect(xsrf).toBeTruthy();
    const signedOut = await start.browser.follow(formAction(confirmHtml, 'op.logoutForm', endSession), {
      method: 'POST',
      form: { xsrf: xsrf!, logout: 'yes' },
    });
    expect(signedOut.response?.status).toBe(200);
    expect(await signedOut.response!.text()).toContain('You are signed out of the local identity provider stand-in.');

    // The session is gone: a new authorization request asks for the password again.
    const again = await start.browser.follow(
      `${idp.issuer}${IDENTITY_PROVIDER_PATHS.authorization}?${new URLSearchParams({
        client_id: CLIENT.clientId,
        response_type: 'code',
        redirect_uri: CLIENT.redirectUris[0],
        scope: 'openid',
      })}`,
    );
    expect(await again.response!.text()).toContain('<label for="password">');
  });

  it('answers an interaction page without its cookie with 400 instead of a crash', async () => {
    const response = await fetch(`${idp.issuer}${IDENTITY_PROVIDER_PATHS.interaction}/no-such-step`);
    expect(response.status).toBe(400);
    expect(await response.text()).toContain('Sign-in attempt not found');
  });
});
