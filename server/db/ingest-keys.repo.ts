import type { DbOrTrx, LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

export interface IngestKeyInfo {
  id: number;
  loggerId: number;
  prefix: string;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

/** What the ingest endpoint learns from a key's prefix. */
export interface IngestKeyMatch {
  tenantId: number;
  keyId: number;
  loggerId: number;
  keyHash: string;
  revoked: boolean;
  loggerRetired: boolean;
  lastUsedAt: Date | null;
}

/**
 * The one lookup that starts without a lab: a logger presents only its key. Matching on the
 * random public prefix yields the lab and logger; the caller then compares the full key's
 * hash in constant time. Everything after this goes through the lab scope.
 */
export async function findIngestKeyByPrefix(db: DbOrTrx, prefix: string): Promise<IngestKeyMatch | null> {
  const row = await db('ingest_keys')
    .join('loggers', function joinLogger() {
      this.on('loggers.tenant_id', '=', 'ingest_keys.tenant_id').andOn('loggers.id', '=', 'ingest_keys.logger_id');
    })
    .where('ingest_keys.prefix', prefix)
    .first(
      'ingest_keys.tenant_id as tenantId',
      'ingest_keys.id as keyId',
      'ingest_keys.logger_id as loggerId',
      'ingest_keys.key_hash as keyHash',
      'ingest_keys.revoked_at as revokedAt',
      'ingest_keys.last_used_at as lastUsedAt',
      'loggers.retired_at as loggerRetiredAt',
    );
  if (!row) return null;
  return {
    tenantId: Number(row.tenantId),
    keyId: Number(row.keyId),
    loggerId: Number(row.loggerId),
    keyHash: row.keyHash,
    revoked: row.revokedAt !== null,
    loggerRetired: row.loggerRetiredAt !== null,
    lastUsedAt: row.lastUsedAt ?? null,
  };
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
export function ingestKeysIn(scope: LabScope) {
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

export type IngestKeysRepo = ReturnType<typeof ingestKeysIn>;
