import type { UsersRepo, User } from '../db/users.repo.ts';
import { AppError } from '../errors.ts';

/** What the identity provider told us about the person (ID token + userinfo). */
export interface ProviderProfile {
  issuer: string;
  subject: string;
  email?: string | null;
  emailVerified?: boolean | null;
  name?: string | null;
}

/** Sign-in refused because the provider did not vouch for an e-mail address. */
export class SignInRefusedError extends AppError {
  constructor(message: string) {
    super(403, 'sign_in_refused', message);
  }
}

/**
 * Turns a successful sign-in at the identity provider into a Lagbook user: created on first
 * sign-in, refreshed after. Lagbook needs an e-mail address (invitations are matched by it),
 * so a profile without one is refused and nothing is written.
 */
export function createSignInService(deps: { users: UsersRepo }) {
  return {
    async recordSignIn(profile: ProviderProfile): Promise<User> {
      const email = profile.email?.trim().toLowerCase();
      if (!email) {
        throw new SignInRefusedError('The identity provider did not share an e-mail address, which Lagbook needs.');
      }
      const displayName = profile.name?.trim() || email;
      return deps.users.upsertFromIdentity({
        issuer: profile.issuer,
        subject: profile.subject,
        email,
        emailVerified: profile.emailVerified === true,
        displayName: displayName.slice(0, 191),
      });
    },
  };
}

export type SignInService = ReturnType<typeof createSignInService>;
