import type { ClockChoice } from '../contract/me.ts';
import type { DbOrTrx } from './tenant-scope.ts';

export interface User {
  id: number;
  oidcIssuer: string;
  oidcSubject: string;
  email: string;
  emailVerified: boolean;
  displayName: string;
  createdAt: Date;
  lastSignInAt: Date | null;
  /** The person's own IANA time zone, if they chose one (alert mails add their clock). */
  timeZone: string | null;
  /** Which clock the person reads times on, in the app and in alert mails (default `logger`). */
  clock: ClockChoice;
}

interface UserRow {
  id: number;
  oidc_issuer: string;
  oidc_subject: string;
  email: string;
  email_verified: number | boolean;
  display_name: string;
  created_at: Date;
  last_sign_in_at: Date | null;
  time_zone: string | null;
  clock?: ClockChoice | null;
}

function toUser(r: UserRow): User {
  return {
    id: Number(r.id),
    oidcIssuer: r.oidc_issuer,
    oidcSubject: r.oidc_subject,
    email: r.email,
    emailVerified: Boolean(r.email_verified),
    displayName: r.display_name,
    createdAt: r.created_at,
    lastSignInAt: r.last_sign_in_at,
    timeZone: r.time_zone ?? null,
    clock: r.clock ?? 'logger',
  };
}

export interface IdentityClaims {
  issuer: string;
  subject: string;
  email: string;
  emailVerified: boolean;
  displayName: string;
}

/** Data access for `users` (global, not lab-owned), on `db` — a connection or a transaction. */
export function usersRepo(db: DbOrTrx) {
  return {
    async findById(id: number): Promise<User | null> {
      const row = await db<UserRow>('users').where({ id }).first();
      return row ? toUser(row) : null;
    },

    /** A person with this verified e-mail address (operators address people by e-mail). */
    async findByVerifiedEmail(email: string): Promise<User | null> {
      const row = await db<UserRow>('users').where({ email, email_verified: true }).orderBy('id').first();
      return row ? toUser(row) : null;
    },

    async findByIdentity(issuer: string, subject: string): Promise<User | null> {
      const row = await db<UserRow>('users').where({ oidc_issuer: issuer, oidc_subject: subject }).first();
      return row ? toUser(row) : null;
    },

    /**
     * Creates the user on first sign-in or refreshes e-mail and name from the provider's
     * claims, and stamps the sign-in time. One statement, so it is atomic on its own.
     */
    async upsertFromIdentity(claims: IdentityClaims): Promise<User> {
      const now = new Date();
      await db('users')
        .insert({
          oidc_issuer: claims.issuer,
          oidc_subject: claims.subject,
          email: claims.email,
          email_verified: claims.emailVerified,
          display_name: claims.displayName,
          last_sign_in_at: now,
        })
        .onConflict(['oidc_issuer', 'oidc_subject'])
        .merge(['email', 'email_verified', 'display_name', 'last_sign_in_at']);
      const user = await this.findByIdentity(claims.issuer, claims.subject);
      if (!user) throw new Error('upsertFromIdentity: the user row vanished');
      return user;
    },

    /** Sets (or, with null, clears) the person's own time zone; the caller has checked the name. */
    async setTimeZone(id: number, timeZone: string | null): Promise<void> {
      await db('users').where({ id }).update({ time_zone: timeZone });
    },

    /** Saves the person's clock choice (the caller has checked it is one of the choices). */
    async setClock(id: number, clock: ClockChoice): Promise<void> {
      await db('users').where({ id }).update({ clock });
    },
  };
}

export type UsersRepo = ReturnType<typeof usersRepo>;
