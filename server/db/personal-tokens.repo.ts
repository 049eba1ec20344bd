import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

/** A personal token as its owner sees it (never the secret or its hash). */
export interface PersonalTokenInfo {
  id: number;
  userId: number;
  name: string;
  prefix: string;
  createdAt: Date;
  expiresAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

const COLUMNS = [
  'personal_tokens.id',
  'personal_tokens.user_id as userId',
  'personal_tokens.name',
  'personal_tokens.prefix',
  'personal_tokens.created_at as createdAt',
  'personal_tokens.expires_at as expiresAt',
  'personal_tokens.last_used_at as lastUsedAt',
  'personal_tokens.revoked_at as revokedAt',
];
const toInfo = (r: Record<string, unknown>): PersonalTokenInfo => ({
  id: Number(r.id),
  userId: Number(r.userId),
  name: r.name as string,
  prefix: r.prefix as string,
  createdAt: r.createdAt as Date,
  expiresAt: r.expiresAt as Date,
  lastUsedAt: (r.lastUsedAt as Date | null) ?? null,
  revokedAt: (r.revokedAt as Date | null) ?? null,
});

/** Data access for one lab's `personal_tokens`. */
export function personalTokensRepo(scope: LabScope) {
  return {
    async listForUser(userId: number): Promise<PersonalTokenInfo[]> {
      const rows = await scope
        .table('personal_tokens')
        .where('personal_tokens.user_id', userId)
        .orderBy([{ column: 'personal_tokens.created_at', order: 'desc' }, { column: 'personal_tokens.id' }])
        .select(COLUMNS);
      return rows.map(toInfo);
    },

    async find(id: number): Promise<PersonalTokenInfo | null> {
      const row = await scope.table('personal_tokens').where('personal_tokens.id', id).first(COLUMNS);
      return row ? toInfo(row) : null;
    },

    async insert(input: { userId: number; name: string; prefix: string; tokenHash: string; expiresAt: Date; createdAt: Date }): Promise<number> {
      const id = newId();
      await scope.insert('personal_tokens', {
        id,
        user_id: input.userId,
        name: input.name,
        prefix: input.prefix,
        token_hash: input.tokenHash,
        created_at: input.createdAt,
        expires_at: input.expiresAt,
      });
      return id;
    },

    async revoke(id: number, at: Date): Promise<void> {
      await scope.table('personal_tokens').where('personal_tokens.id', id).whereNull('personal_tokens.revoked_at').update({ revoked_at: at });
    },

    async touch(id: number, at: Date): Promise<void> {
      await scope.table('personal_tokens').where('personal_tokens.id', id).update({ last_used_at: at });
    },
  };
}

export type PersonalTokensRepo = ReturnType<typeof personalTokensRepo>;
