import type { Db } from '../../db/create-db.ts';
import type { IngestTarget } from './ingest-batch.ts';
import type { ReadingSource } from '../../db/quarantine.repo.ts';

/** What one committed batch stored: the lab, the logger and, per channel, the newest time written. */
export interface StoredBatch {
  target: IngestTarget;
  source: ReadingSource;
  /** Readings newly stored by this batch (duplicates and quarantined rows excluded). */
  accepted: number;
  /** Rows of this batch going to quarantine (stored with the batch unless a hook refuses it). */
  quarantined: number;
  /**
   * Quarantined rows this batch replaces once it commits (a re-submit from quarantine removes
   * its originals afterwards), so a quarantine cap looks at the net growth. 0 or absent otherwise.
   */
  replacesQuarantined?: number;
  /** Each channel the batch stored into, with the oldest and newest time it carried (epoch ms). */
  channels: Array<{ channelId: number; oldestTs: number; newestTs: number }>;
}

/**
 * Extension points of the one ingestion path (API, uploads, re-submits, test readings), so
 * features such as plan limits and alerts plug in without each caller knowing about them.
 *
 * - `beforeCommit` runs inside the batch's transaction once the new rows are inserted and
 *   counted; throwing refuses the whole batch (the transaction rolls back, nothing is written).
 * - `afterCommit` runs once the batch is committed, i.e. after the reading is safe; it must not
 *   throw (the logger is already owed its 200) — failures are the hook's own to log.
 */
export interface IngestHooks {
  beforeCommit?(trx: Db, batch: StoredBatch): Promise<void>;
  afterCommit?(batch: StoredBatch): void;
}

/** Runs several hooks as one, in order (`beforeCommit` stops at the first refusal). */
export function composeIngestHooks(list: IngestHooks[]): IngestHooks {
  return {
    async beforeCommit(trx, batch) {
      for (const h of list) if (h.beforeCommit) await h.beforeCommit(trx, batch);
    },
    afterCommit(batch) {
      for (const h of list) h.afterCommit?.(batch);
    },
  };
}
