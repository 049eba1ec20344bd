import { describe, expect, it } from 'vitest';
import { createSignInService, SignInRefusedError } from './sign-in.service.ts';
import type { IdentityClaims, UsersRepo, User } from '../db/users.repo.ts';

function fakeUsers() {
  const saved: IdentityClaims[] = [];
  const repo = {
    async upsertFromIdentity(claims: IdentityClaims): Promise<User> {
      saved.push(claims);
      return {
        id: 1,
        oidcIssuer: claims.issuer,
        oidcSubject: claims.subject,
        email: claims.email,
        emailVerified: claims.emailVerified,
        displayName: claims.displayName,
        createdAt: new Date(0),
        lastSignInAt: null,
        timeZone: null,
        clock: 'logger',
      };
    },
  } as unknown as UsersRepo;
  return { repo, saved };
}

describe('sign-in service', () => {
  it('normalises the e-mail address and falls back to it for a missing name', async () => {
    const { repo, saved } = fakeUsers();
    const user = await createSignInService({ users: repo }).recordSignIn({
      issuer: 'http://idp',
      subject: 's1',
      email: '  Maren.Olowe@Fernhollow.example ',
      emailVerified: true,
      name: '',
    });
    expect(user.email).toBe('maren.olowe@fernhollow.example');
    expect(saved).toEqual([
      { issuer: 'http://idp', subject: 's1', email: 'maren.olowe@fernhollow.example', emailVerified: true, displayName: 'maren.olowe@fernhollow.example' },
    ]);
  });

  it('refuses a profile without an e-mail address and writes nothing', async () => {
    const { repo, saved } = fakeUsers();
    await expect(createSignInService({ users: repo }).recordSignIn({ issuer: 'http://idp', subject: 's2', email: null })).rejects.toBeInstanceOf(
      SignInRefusedError,
    );
    expect(saved).toHaveLength(0);
  });

  it('treats a missing email_verified claim as unverified', async () => {
    const { repo, saved } = fakeUsers();
    await createSignInService({ users: repo }).recordSignIn({ issuer: 'i', subject: 's3', email: 'a@b.example', name: 'A' });
    expect(saved[0].emailVerified).toBe(false);
  });
});
