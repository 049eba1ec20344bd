import pLimit from 'p-limit';
import type { Db } from '../../db/create-db.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import { ingestKeysRepo } from '../../db/ingest-keys.repo.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { AppError } from '../../errors.ts';
import { ingestKeyMatches, ingestKeyPrefix } from '../ingest-key-format.ts';
import type { IngestHooks } from './ingest-hooks.ts';
import { ingestBatch, type IncomingReading, type IngestOptions, type IngestOutcome, type IngestTarget } from './ingest-batch.ts';

/** 401 for a missing, malformed, unknown or revoked ingest key (one answer for all: nothing to probe). */
export class InvalidIngestKeyError extends AppError {
  constructor() {
    super(401, 'invalid_ingest_key', 'Send a valid ingest key as "Authorization: Bearer lbk_…". Ask a technician for the logger\'s key.');
  }
}

export interface AuthenticatedLogger extends IngestTarget {
  keyId: number;
}

const TOUCH_EVERY_MS = 60_000;

/** The logger side of ingestion: who is sending (by key) and storing what they send. */
export function createIngestService(deps: { db: Db; now?: () => number; hooks?: IngestHooks; maxConcurrentBatches?: number }) {
  const now = deps.now ?? Date.now;
  // Batches beyond this many wait their turn here instead of taking every pooled connection,
  // so people browsing while many loggers post still find a free connection at once.
  const gate = pLimit(deps.maxConcurrentBatches ?? 4);
  return {
    /** Resolves a presented key to its lab and logger; refuses revoked keys and retired loggers. */
    async authenticate(presented: string | undefined): Promise<AuthenticatedLogger> {
      const prefix = presented ? ingestKeyPrefix(presented) : null;
      if (!presented || !prefix) throw new InvalidIngestKeyError();
      const match = await crossLabRepo(deps.db).ingestKeyByPrefix(prefix);
      if (!match || match.revoked || match.loggerRetired || !ingestKeyMatches(presented, match.keyHash)) throw new InvalidIngestKeyError();
      if (!match.lastUsedAt || now() - match.lastUsedAt.getTime() > TOUCH_EVERY_MS) {
        await ingestKeysRepo(inLab(deps.db, match.tenantId)).touch(match.keyId, new Date(now()));
      }
      return { tenantId: match.tenantId, loggerId: match.loggerId, keyId: match.keyId };
    },

    ingest(target: IngestTarget, rows: IncomingReading[], opts: Omit<IngestOptions, 'now'>): Promise<IngestOutcome> {
      return gate(() => ingestBatch(deps.db, target, rows, { ...opts, now, hooks: deps.hooks }));
    },
  };
}

export type IngestService = ReturnType<typeof createIngestService>;
