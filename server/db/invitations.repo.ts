import type { LabScope } from './tenant-scope.ts';
import type { Role } from '../policies/permissions.ts';
import { newId } from './new-id.ts';

export interface Invitation {
  id: number;
  email: string;
  role: Role;
  invitedBy: { name: string; email: string } | null;
  createdAt: Date;
  lastSentAt: Date;
  expiresAt: Date;
  acceptedAt: Date | null;
  revokedAt: Date | null;
}

const COLUMNS = [
  'invitations.id',
  'invitations.email',
  'invitations.role',
  'invitations.created_at as createdAt',
  'invitations.last_sent_at as lastSentAt',
  'invitations.expires_at as expiresAt',
  'invitations.accepted_at as acceptedAt',
  'invitations.revoked_at as revokedAt',
  'inviter.display_name as inviterName',
  'inviter.email as inviterEmail',
];

function toInvitation(r: Record<string, unknown>): Invitation {
  return {
    id: Number(r.id),
    email: r.email as string,
    role: r.role as Role,
    invitedBy: r.inviterEmail ? { name: r.inviterName as string, email: r.inviterEmail as string } : null,
    createdAt: r.createdAt as Date,
    lastSentAt: r.lastSentAt as Date,
    expiresAt: r.expiresAt as Date,
    acceptedAt: (r.acceptedAt as Date | null) ?? null,
    revokedAt: (r.revokedAt as Date | null) ?? null,
  };
}

/** Data access for one lab's `invitations`; every query starts at the lab scope. */
export function invitationsRepo(scope: LabScope) {
  const base = () => scope.table('invitations').leftJoin('users as inviter', 'inviter.id', 'invitations.invited_by_user_id');
  return {
    async listPending(now: Date): Promise<Invitation[]> {
      const rows = await base()
        .whereNull('invitations.accepted_at')
        .whereNull('invitations.revoked_at')
        .where('invitations.expires_at', '>', now)
        .orderBy('invitations.created_at', 'desc')
        .select(COLUMNS);
      return rows.map(toInvitation);
    },

    async findById(id: number, opts: { lock?: boolean } = {}): Promise<Invitation | null> {
      const q = base().where('invitations.id', id).select(COLUMNS);
      const row = await (opts.lock ? q.forUpdate('invitations') : q).first();
      return row ? toInvitation(row) : null;
    },

    async findByTokenHash(tokenHash: string, opts: { lock?: boolean } = {}): Promise<Invitation | null> {
      const q = base().where('invitations.token_hash', tokenHash).select(COLUMNS);
      const row = await (opts.lock ? q.forUpdate('invitations') : q).first();
      return row ? toInvitation(row) : null;
    },

    /** Pending invitations to one address (callers lock the lab first to make check-then-insert atomic). */
    async pendingFor(email: string, now: Date): Promise<Invitation[]> {
      const rows = await base()
        .where('invitations.email', email)
        .whereNull('invitations.accepted_at')
        .whereNull('invitations.revoked_at')
        .where('invitations.expires_at', '>', now)
        .select(COLUMNS);
      return rows.map(toInvitation);
    },

    async insert(input: { email: string; role: Role; tokenHash: string; invitedBy: number | null; expiresAt: Date }): Promise<number> {
      const id = newId();
      await scope.insert('invitations', {
        id,
        email: input.email,
        role: input.role,
        token_hash: input.tokenHash,
        invited_by_user_id: input.invitedBy,
        expires_at: input.expiresAt,
      });
      return id;
    },

    async renew(id: number, tokenHash: string, expiresAt: Date, now: Date): Promise<void> {
      await scope.table('invitations').where('invitations.id', id).update({ token_hash: tokenHash, expires_at: expiresAt, last_sent_at: now });
    },

    async markAccepted(id: number, userId: number, now: Date): Promise<void> {
      await scope.table('invitations').where('invitations.id', id).update({ accepted_at: now, accepted_by_user_id: userId });
    },

    async markRevoked(id: number, now: Date): Promise<void> {
      await scope.table('invitations').where('invitations.id', id).update({ revoked_at: now });
    },
  };
}

export type InvitationsRepo = ReturnType<typeof invitationsRepo>;
