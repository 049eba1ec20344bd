import type { IngestHooks } from './ingest-hooks.ts';
import { MAX_QUARANTINED_PER_BATCH, TooManyQuarantinedError } from './readings-from-body.ts';

/**
 * The per-batch quarantine cap as an ingestion hook, for every way readings come in (logger
 * API, upload batches, re-submits, test readings): a batch that would add more than `max` rows
 * to quarantine — whatever the reason: unreadable, unknown channel, conflicts — is refused whole
 * (422, the transaction rolls back). The body readers already stop early at the same cap for
 * rows they can tell are bad (a field missing); this catches the reasons only the batch knows.
 * A re-submit counts only what it adds beyond the rows it replaces.
 */
export function quarantineCapHook(max: number = MAX_QUARANTINED_PER_BATCH): IngestHooks {
  return {
    async beforeCommit(_trx, batch) {
      const growth = batch.quarantined - (batch.replacesQuarantined ?? 0);
      if (growth > max) throw new TooManyQuarantinedError([], max, batch.quarantined);
    },
  };
}
