import type { Page } from 'playwright-core';
import type { Role } from '../../server/policies/permissions.ts';
import type { TestApp } from './test-app.ts';
import { buildLab, type TestLab } from './factories.ts';
import { signInThroughLagbook } from './browser.ts';

/**
 * Signs `person` in through the identity provider (the first sign-in creates their user row),
 * then makes them a member of a fresh lab named `labName` in `role`. For browser tests that
 * start from a real signed-in session.
 */
export async function signInAsMemberOfNewLab(
  t: TestApp,
  page: Page,
  appUrl: string,
  person: { sub: string; email: string; password: string },
  lab: { name: string; role: Role },
): Promise<TestLab> {
  await signInThroughLagbook(page, appUrl, t.config.oidc.issuer, person);
  const user = await t.db('users').where({ oidc_issuer: t.config.oidc.issuer, oidc_subject: person.sub }).first();
  const made = await buildLab(t.db, { name: lab.name });
  await t.db('memberships').insert({ tenant_id: made.id, user_id: user.id, role: lab.role });
  return made;
}
