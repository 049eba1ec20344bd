import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

export interface IngestKeyInfo {
  id: number;
  loggerId: number;
  prefix: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

const COLUMNS = [
  'ingest_keys.id',
  'ingest_keys.logger_id as loggerId',
  'ingest_keys.prefix',
  'ingest_keys.created_at as createdAt',
  'ingest_keys.last_used_at as lastUsedAt',
  'ingest_keys.revoked_at as revokedAt',
];
const toInfo = (r: Record<string, unknown>): IngestKeyInfo => ({
  id: Number(r.id),
  loggerId: Number(r.loggerId),
  prefix: r.prefix as string,
  createdAt: r.createdAt as Date,
  lastUsedAt: (r.lastUsedAt as Date | null) ?? null,
  revokedAt: (r.revokedAt as Date | null) ?? null,
});

/** Data access for one lab's `ingest_keys`. */
export function ingestKeysRepo(scope: LabScope) {
  return {
    async listForLogger(loggerId: number): Promise<IngestKeyInfo[]> {
      const rows = await scope.table('ingest_keys').where('ingest_keys.logger_id', loggerId).orderBy('ingest_keys.created_at', 'desc').select(COLUMNS);
      return rows.map(toInfo);
    },

    async find(id: number): Promise<IngestKeyInfo | null> {
      const row = await scope.table('ingest_keys').where('ingest_keys.id', id).first(COLUMNS);
      return row ? toInfo(row) : null;
    },

    async insert(input: { loggerId: number; prefix: string; keyHash: string; createdBy: number | null }): Promise<number> {
      const id = newId();
      await scope.insert('ingest_keys', { id, logger_id: input.loggerId, prefix: input.prefix, key_hash: input.keyHash, created_by_user_id: input.createdBy });
      return id;
    },

    async revoke(id: number, at: Date): Promise<void> {
      await scope.table('ingest_keys').where('ingest_keys.id', id).whereNull('ingest_keys.revoked_at').update({ revoked_at: at });
    },

    async revokeAllForLogger(loggerId: number, at: Date): Promise<void> {
      await scope.table('ingest_keys').where('ingest_keys.logger_id', loggerId).whereNull('ingest_keys.revoked_at').update({ revoked_at: at });
    },

    async touch(id: number, at: Date): Promise<void> {
      await scope.table('ingest_keys').where('ingest_keys.id', id).update({ last_used_at: at });
    },
  };
}

export type IngestKeysRepo = ReturnType<typeof ingestKeysRepo>;
