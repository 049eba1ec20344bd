import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHmac } from 'node:crypto';
import { buildTestApp, type TestApp } from '../support/test-app.ts';

let t: TestApp;
beforeAll(async () => {
  t = await buildTestApp();
});
afterAll(async () => t.close());

describe('health and unknown routes', () => {
  it('GET /healthz answers 200 when the database answers', async () => {
    const res = await request(t.app).get('/healthz').expect(200);
    expect(res.body).toEqual({ status: 'ok', database: 'ok' });
  });

  it('unknown API routes answer JSON 404 with a stable code', async () => {
    const res = await request(t.app).get('/api/v1/no-such-thing').expect(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body).toEqual({ error: { code: 'not_found', message: 'No route for GET /api/v1/no-such-thing.' } });
  });

  it('unauthenticated API calls answer JSON 401', async () => {
    const res = await request(t.app).get('/api/v1/me').expect(401);
    expect(res.body).toEqual({ error: { code: 'unauthenticated', message: 'Sign in to continue.' } });
  });

  it('sends a strict Content Security Policy and no X-Powered-By', async () => {
    const res = await request(t.app).get('/healthz');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('serves the built client for client routes, with index.html never cached', async () => {
    const res = await request(t.app).get('/some/client/route').expect(200);
    expect(res.text).toContain('<div id="root"></div>');
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('refuses a cross-site write with 403 before it reaches any route', async () => {
    const res = await request(t.app).post('/auth/sign-out').set('Origin', 'http://evil.example').expect(403);
    expect(res.body.error.code).toBe('cross_site_request');
  });

  it('answers 503 with Retry-After when the database is unreachable, and stays up', async () => {
    const { createDb } = await import('../../server/db/create-db.ts');
    const { createApp } = await import('../../server/app.ts');
    const { createLogWriter } = await import('../../server/log-writer.ts');
    const deadDb = createDb({ ...t.config.db, port: 1 });
    const app = createApp({
      config: t.config,
      db: deadDb,
      logger: createLogWriter({ silent: true }),
      identity: {
        endpoints: {
          issuer: t.config.oidc.issuer,
          authorization_endpoint: `${t.config.oidc.issuer}/auth`,
          token_endpoint: `${t.config.oidc.issuer}/token`,
          userinfo_endpoint: `${t.config.oidc.issuer}/me`,
        },
      },
      mailer: { send: async () => {}, verify: async () => false, close: () => {} },
      billing: {} as never,
    });
    const health = await request(app).get('/healthz').expect(503);
    expect(health.body).toEqual({ status: 'degraded', database: 'unreachable' });
    // A validly signed session cookie makes the session store ask the (dead) database.
    const sid = 'test-session-id';
    const mac = createHmac('sha256', t.config.sessionSecret).update(sid).digest('base64').replace(/=+$/, '');
    const me = await request(app)
      .get('/api/v1/me')
      .set('Cookie', `lagbook.sid=${encodeURIComponent(`s:${sid}.${mac}`)}`)
      .expect(503);
    expect(me.headers['retry-after']).toBe('5');
    expect(me.body.error.code).toBe('service_unavailable');
    await deadDb.destroy();
  });
});
