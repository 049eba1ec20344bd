import { createHmac, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { Role } from '../../server/policies/permissions.ts';
import { SESSION_COOKIE } from '../../server/http/middleware/session.ts';
import type { AppDeps } from '../../server/app.ts';
import { createLogWriter } from '../../server/log-writer.ts';

/**
 * Test data factories with overrides (`buildUser`, `buildLab`, `buildMember`) writing
 * straight to the real database, and `sessionCookieFor`, which creates a real session row
 * for a user — the same row a completed OIDC sign-in leaves — so API tests can act as any
 * person without walking the provider's pages each time.
 */
let counter = 0;
const unique = () => `${Date.now().toString(36)}${(counter++).toString(36)}${randomBytes(2).toString('hex')}`;

export interface TestUser {
  id: number;
  email: string;
  displayName: string;
}

export async function buildUser(db: Knex, overrides: Partial<{ email: string; displayName: string; emailVerified: boolean }> = {}): Promise<TestUser> {
  const u = unique();
  const email = overrides.email ?? `person-${u}@lab.example`;
  const displayName = overrides.displayName ?? `Person ${u}`;
  const [id] = await db('users').insert({
    oidc_issuer: 'http://factory.test',
    oidc_subject: `sub-${u}`,
    email,
    email_verified: overrides.emailVerified ?? true,
    display_name: displayName,
  });
  return { id: Number(id), email, displayName };
}

export interface TestLab {
  id: number;
  slug: string;
  name: string;
  description: string;
}

export async function buildLab(db: Knex, overrides: Partial<{ slug: string; name: string }> = {}): Promise<TestLab> {
  const u = unique();
  const slug = overrides.slug ?? `lab-${u}`;
  const name = overrides.name ?? `Test lab ${u}`;
  const [id] = await db('labs').insert({ slug, name });
  return { id: Number(id), slug, name, description: '' };
}

/** A new user who is a member of `lab` with `role`. */
export async function buildMember(
  db: Knex,
  lab: TestLab,
  { role, ...user }: { role: Role } & Partial<{ email: string; displayName: string; emailVerified: boolean }>,
): Promise<TestUser> {
  const person = await buildUser(db, user);
  await db('memberships').insert({ tenant_id: lab.id, user_id: person.id, role });
  return person;
}

/** A `Cookie` header value signed in as `userId` (express-session's signed-cookie format). */
export async function sessionCookieFor(db: Knex, secret: string, userId: number): Promise<string> {
  const sid = randomBytes(24).toString('base64url');
  const maxAge = 3600 * 1000;
  const sess = {
    cookie: { originalMaxAge: maxAge, expires: new Date(Date.now() + maxAge).toISOString(), httpOnly: true, path: '/', sameSite: 'lax', secure: false },
    passport: { user: userId },
  };
  await db('sessions').insert({ sid, sess: JSON.stringify(sess), expired: new Date(Date.now() + maxAge) });
  const mac = createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '');
  return `${SESSION_COOKIE}=${encodeURIComponent(`s:${sid}.${mac}`)}`;
}

/**
 * Dependencies for a second app on the test database (`t.config`, `t.db`) whose sign-in, mail
 * and billing are inert stand-ins — for routes that use none of them, e.g. to hand in another
 * analysis pool. `extra` replaces any of them.
 */
export function standInAppDeps(base: Pick<AppDeps, 'config' | 'db'>, extra: Partial<AppDeps> = {}): AppDeps {
  return {
    config: { ...base.config, clientDir: null },
    db: base.db,
    logger: createLogWriter({ silent: true }),
    identity: { endpoints: { issuer: 'http://x', authorization_endpoint: 'http://x/a', token_endpoint: 'http://x/t', userinfo_endpoint: 'http://x/u' } },
    mailer: { send: async () => {}, verify: async () => true, close: () => {} },
    billing: {} as never,
    ...extra,
  };
}
