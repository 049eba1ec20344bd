import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { BrowserlessSession, signInThroughProvider } from '../support/browserless-session.ts';
import { DEV_ACCOUNTS } from '../../tenants/demo/people.ts';

const scientist = DEV_ACCOUNTS.find((a) => a.role === 'scientist')!;
const newcomer = DEV_ACCOUNTS.find((a) => a.role === 'none')!;

let t: TestApp;
let appUrl: string;
beforeAll(async () => {
  t = await buildTestApp();
  appUrl = await t.listen();
});
afterAll(async () => t.close());

async function usersWithEmail(email: string): Promise<number> {
  const [{ n }] = await t.db('users').where({ email }).count({ n: '*' });
  return Number(n);
}

describe('sign-in through the OpenID Connect provider', () => {
  beforeEach(async () => {
    await t.db('users').where({ email: newcomer.email }).delete();
  });

  it('signs a dev account in and shows who they are at /api/v1/me', async () => {
    const outcome = await signInThroughProvider(appUrl, scientist);
    expect(outcome.finalUrl).toBe(`${appUrl}/`);
    const me = await outcome.session.request(`${appUrl}/api/v1/me`);
    expect(me.status).toBe(200);
    const body = (await me.json()) as { user: Record<string, unknown>; labs: unknown[] };
    expect(body.user).toMatchObject({ email: scientist.email, name: scientist.name });
    expect(Array.isArray(body.labs)).toBe(true);
    // Only what the presenter allows leaves the server (the clock choice and the time zone is the person's own setting).
    expect(Object.keys(body.user).sort()).toEqual(['clock', 'email', 'id', 'name', 'timeZone']);
    // The provider vouches for the address (userinfo email_verified: true): it is stored as verified.
    const row = await t.db('users').where({ email: scientist.email }).first();
    expect(Boolean(row.email_verified)).toBe(true);
    expect(row.oidc_issuer).toBe(t.config.oidc.issuer);
  });

  it('sends state, nonce and a PKCE S256 challenge in the authorization request (RFC 7636 §4.3)', async () => {
    const session = new BrowserlessSession();
    const res = await session.request(`${appUrl}/auth/sign-in`);
    expect(res.status).toBe(302);
    const location = new URL(res.headers.get('location')!);
    expect(location.origin).toBe(t.config.oidc.issuer);
    expect(location.searchParams.get('code_challenge_method')).toBe('S256');
    expect(location.searchParams.get('code_challenge')).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(location.searchParams.get('state')).toBeTruthy();
    expect(location.searchParams.get('nonce')).toBeTruthy();
    expect(location.searchParams.get('redirect_uri')).toBe(`${appUrl}/auth/callback`);
  });

  it('creates the account on first sign-in only, and keeps one row on later sign-ins', async () => {
    expect(await usersWithEmail(newcomer.email)).toBe(0);
    await signInThroughProvider(appUrl, newcomer);
    await signInThroughProvider(appUrl, newcomer);
    expect(await usersWithEmail(newcomer.email)).toBe(1);
  });

  it('a wrong password stays at the provider with its message and creates no account', async () => {
    const outcome = await signInThroughProvider(appUrl, { email: newcomer.email, password: 'not-the-password' });
    expect(outcome.finalUrl.startsWith(t.config.oidc.issuer)).toBe(true);
    expect(await usersWithEmail(newcomer.email)).toBe(0);
  });

  it('cancelled consent comes back to the sign-in page with error=cancelled and creates no account', async () => {
    const outcome = await signInThroughProvider(appUrl, newcomer, { consent: 'deny' });
    expect(outcome.finalUrl).toBe(`${appUrl}/sign-in?error=cancelled`);
    expect(await usersWithEmail(newcomer.email)).toBe(0);
  });

  it('a callback with a forged state is refused with error=state_mismatch and creates no account', async () => {
    const session = new BrowserlessSession();
    await session.request(`${appUrl}/auth/sign-in`); // a real flow is pending in this session
    const res = await session.request(`${appUrl}/auth/callback?code=stolen-code&state=forged-state`);
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe('/sign-in?error=state_mismatch');
    expect(await usersWithEmail(newcomer.email)).toBe(0);
  });

  it('returns to the requested page after sign-in, but never to another site', async () => {
    const back = await signInThroughProvider(appUrl, scientist, { returnTo: '/labs/x/channels?range=7d' });
    expect(back.finalUrl).toBe(`${appUrl}/labs/x/channels?range=7d`);
    const offsite = await signInThroughProvider(appUrl, scientist, { returnTo: '//evil.example/steal' });
    expect(offsite.finalUrl).toBe(`${appUrl}/`);
  });

  it('"use another account" asks the provider for a fresh login with the address pre-filled', async () => {
    const session = new BrowserlessSession();
    const res = await session.request(`${appUrl}/auth/sign-in?switchAccount=1&loginHint=${encodeURIComponent(newcomer.email)}`);
    const location = new URL(res.headers.get('location')!);
    expect(location.searchParams.get('prompt')).toBe('login');
    expect(location.searchParams.get('login_hint')).toBe(newcomer.email);
  });

  it('sign-out ends the session: /api/v1/me answers 401 afterwards', async () => {
    const { session } = await signInThroughProvider(appUrl, scientist);
    expect((await session.request(`${appUrl}/api/v1/me`)).status).toBe(200);
    const out = await session.request(`${appUrl}/auth/sign-out`, { method: 'POST', headers: { origin: appUrl } });
    expect(out.status).toBe(204);
    const after = await session.request(`${appUrl}/api/v1/me`);
    expect(after.status).toBe(401);
  });

  it('a session whose user was deleted is treated as signed out on the next request', async () => {
    const { session } = await signInThroughProvider(appUrl, newcomer);
    expect((await session.request(`${appUrl}/api/v1/me`)).status).toBe(200);
    await t.db('users').where({ email: newcomer.email }).delete();
    expect((await session.request(`${appUrl}/api/v1/me`)).status).toBe(401);
  });
});
