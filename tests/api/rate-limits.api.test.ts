import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { buildTestApp, type TestApp } from '../support/test-app.ts';
import { buildLab, buildMember, sessionCookieFor, type TestLab } from '../support/factories.ts';
import { createApp } from '../../server/app.ts';
import { createLogWriter } from '../../server/log-writer.ts';
import type { RateLimits } from '../../server/http/middleware/rate-limits.ts';
import { onLargestPlan } from '../support/largest-plan.ts';

/**
 * Rate limits on the routes that are cheap to call and costly to answer: the sign-in
 * redirects (per client IP) and invitation mail (per signed-in admin). Over the limit the
 * answer is 429 with Retry-After and the usual error body; the counted action does not happen.
 */
let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

/** The real app with its own limits and a mailer that counts what it was asked to send. */
function appWith(rateLimits?: Partial<RateLimits>): { app: Express; sent: string[] } {
  const sent: string[] = [];
  const issuer = t.config.oidc.issuer;
  const app = createApp({
    config: t.config,
    db: t.db,
    logger: createLogWriter({ silent: true }),
    identity: { endpoints: { issuer, authorization_endpoint: `${issuer}/auth`, token_endpoint: `${issuer}/token`, userinfo_endpoint: `${issuer}/me` } },
    mailer: { send: async (m) => void sent.push(m.to), verify: async () => true, close: () => undefined },
    billing: {} as never,
    rateLimits,
  });
  return { app, sent };
}

function expectLimited(res: request.Response, windowS: number) {
  expect(res.status).toBe(429);
  expect(res.body).toEqual({ error: { code: 'rate_limited', message: expect.stringMatching(/try again later/) } });
  const retryAfter = Number(res.headers['retry-after']);
  expect(Number.isInteger(retryAfter)).toBe(true);
  expect(retryAfter).toBeGreaterThan(0);
  expect(retryAfter).toBeLessThanOrEqual(windowS);
}

describe('sign-in redirects, per client IP', () => {
  it('lets the limit through, then answers 429 with Retry-After; sign-in and callback count separately', async () => {
    const { app } = appWith({ signIn: { limit: 3, windowMs: 60_000 } });
    for (let i = 0; i < 3; i++) {
      const res = await request(app).get('/auth/sign-in');
      expect(res.status).toBe(302);
      expect(res.headers.location).toContain(`${t.config.oidc.issuer}/auth`);
    }
    expectLimited(await request(app).get('/auth/sign-in'), 60);

    // The callback has its own count: three failed callbacks are sent back to the sign-in page…
    for (let i = 0; i < 3; i++) {
      const res = await request(app).get('/auth/callback?state=nope&code=nope');
      expect(res.status).toBe(303);
      expect(res.headers.location).toMatch(/^\/sign-in\?error=/);
    }
    // …and the fourth is refused before it reaches the provider.
    expectLimited(await request(app).get('/auth/callback?state=nope&code=nope'), 60);
  });

  it('opens again when the window has passed', async () => {
    const { app } = appWith({ signIn: { limit: 1, windowMs: 1000 } });
    expect((await request(app).get('/auth/sign-in')).status).toBe(302);
    expectLimited(await request(app).get('/auth/sign-in'), 1);
    await new Promise((r) => setTimeout(r, 1100));
    expect((await request(app).get('/auth/sign-in')).status).toBe(302);
  });

  it('defaults to 60 per client IP per 5 minutes', async () => {
    const { app } = appWith();
    for (let i = 0; i < 60; i++) expect((await request(app).get('/auth/sign-in')).status).toBe(302);
    expectLimited(await request(app).get('/auth/sign-in'), 300);
  });
});

describe('invitations, per signed-in admin', () => {
  let lab: TestLab;
  let adminCookie: string;
  let guestCookie: string;
  beforeAll(async () => {
    lab = await buildLab(t.db);
    adminCookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, lab, { role: 'admin' })).id);
    guestCookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, lab, { role: 'guest' })).id);
  });
  const invite = (app: Express, cookie: string, slug: string) =>
    request(app)
      .post(`/api/v1/labs/${slug}/invitations`)
      .set('Cookie', cookie)
      .send({ email: `limit-${Math.random().toString(36).slice(2)}@lab.example`, role: 'guest' });

  it('counts creating and resending together; over the limit nothing is mailed and other admins are unaffected', async () => {
    const { app, sent } = appWith({ invitations: { limit: 3, windowMs: 60_000 } });
    const first = await invite(app, adminCookie, lab.slug).expect(201);
    await invite(app, adminCookie, lab.slug).expect(201);
    await request(app).post(`/api/v1/labs/${lab.slug}/invitations/${first.body.invitation.id}/resend`).set('Cookie', adminCookie).expect(200);
    expect(sent).toHaveLength(3);

    expectLimited(await invite(app, adminCookie, lab.slug), 60);
    expectLimited(await request(app).post(`/api/v1/labs/${lab.slug}/invitations/${first.body.invitation.id}/resend`).set('Cookie', adminCookie), 60);
    expect(sent).toHaveLength(3);

    // Reading and revoking are not limited.
    await request(app).get(`/api/v1/labs/${lab.slug}/invitations`).set('Cookie', adminCookie).expect(200);
    await request(app).delete(`/api/v1/labs/${lab.slug}/invitations/${first.body.invitation.id}`).set('Cookie', adminCookie).expect(204);

    // The limit is per person: an admin of another lab (same IP) still invites.
    const other = await buildLab(t.db);
    const otherCookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, other, { role: 'admin' })).id);
    await invite(app, otherCookie, other.slug).expect(201);
    expect(sent).toHaveLength(4);
  });

  it('applies after the guard: refused callers get 401/403 and use up nobody’s allowance', async () => {
    const { app } = appWith({ invitations: { limit: 1, windowMs: 60_000 } });
    for (let i = 0; i < 3; i++) {
      await request(app).post(`/api/v1/labs/${lab.slug}/invitations`).send({ email: 'x@lab.example', role: 'guest' }).expect(401);
      await invite(app, guestCookie, lab.slug).expect(403);
    }
    await invite(app, adminCookie, lab.slug).expect(201);
    expectLimited(await invite(app, adminCookie, lab.slug), 60);
  });

  it('defaults to 30 per admin per hour', async () => {
    const { app, sent } = appWith();
    const busy = await buildLab(t.db);
    await onLargestPlan(t.db, busy.id); // 30 pending invitations: more than the free plan's members
    const cookie = await sessionCookieFor(t.db, t.config.sessionSecret, (await buildMember(t.db, busy, { role: 'admin' })).id);
    for (let i = 0; i < 30; i++) await invite(app, cookie, busy.slug).expect(201);
    expectLimited(await invite(app, cookie, busy.slug), 3600);
    expect(sent).toHaveLength(30);
  });
});
