import { Passport } from 'passport';
import type { Profile } from 'passport';
import type {} from '../../types/express-user.d.ts';
import type { Config } from '../../config.ts';
import type { OidcEndpoints } from '../../integrations/identity/oidc-discovery.ts';
import { PkceOidcStrategy } from '../../integrations/identity/pkce-oidc-strategy.ts';
import type { UsersRepo, User } from '../../db/users.repo.ts';
import type { SignInService } from '../../services/sign-in.service.ts';

export const OIDC_STRATEGY = 'lagbook-oidc';

/** A Passport instance (the package exports the class as a value only). */
export type PassportInstance = InstanceType<typeof Passport>;

/**
 * A Passport instance of our own (not the global singleton, so several apps can live in one
 * test process) with the OIDC strategy and session (de)serialisation. The session holds only
 * the user id; the user is re-read on every request, so a deleted user is signed out at once.
 */
export function createPassport(deps: { config: Config; endpoints: OidcEndpoints; users: UsersRepo; signIn: SignInService }): PassportInstance {
  const passport = new Passport();
  const { oidc } = deps.config;
  passport.use(
    OIDC_STRATEGY,
    new PkceOidcStrategy(
      {
        issuer: oidc.issuer,
        authorizationURL: deps.endpoints.authorization_endpoint,
        tokenURL: deps.endpoints.token_endpoint,
        userInfoURL: deps.endpoints.userinfo_endpoint,
        clientID: oidc.clientId,
        clientSecret: oidc.clientSecret,
        callbackURL: oidc.redirectUri,
        scope: ['email', 'profile'],
        skipUserProfile: false,
        nonce: 'true',
      } as ConstructorParameters<typeof PkceOidcStrategy>[0],
      // @ts-expect-error the typings list the shorter verify forms only
      // The nine-argument form is the one that hands over the userinfo answer itself
      // (`uiProfile._json`): the merged profile of the shorter forms drops `email_verified`.
      (
        issuer: string,
        uiProfile: Profile | undefined,
        idProfile: Profile,
        _context: unknown,
        _idToken: unknown,
        _accessToken: unknown,
        _refreshToken: unknown,
        _params: unknown,
        done: (err: Error | null, user?: User | false, info?: { message: string }) => void,
      ) => {
        const claims = ((uiProfile as (Profile & { _json?: Record<string, unknown> }) | undefined)?._json ?? {}) as Record<string, unknown>;
        // OpenID Connect Core §5.3.2: the UserInfo `sub` must equal the ID token's, or the answer is not about this person.
        if (uiProfile && uiProfile.id !== idProfile.id) return done(null, false, { message: 'userinfo subject mismatch' });
        deps.signIn
          .recordSignIn({
            issuer,
            subject: idProfile.id,
            email: (claims.email as string | undefined) ?? uiProfile?.emails?.[0]?.value ?? idProfile.emails?.[0]?.value,
            emailVerified: claims.email_verified === true || claims.email_verified === 'true',
            name: (claims.name as string | undefined) ?? uiProfile?.displayName ?? idProfile.displayName,
          })
          .then(
            (user) => done(null, user),
            (err: Error) => done(err),
          );
      },
    ),
  );
  passport.serializeUser((user, done) => done(null, (user as User).id));
  passport.deserializeUser((id: number, done) => {
    deps.users.findById(Number(id)).then((user) => done(null, user ?? false), done);
  });
  return passport;
}
