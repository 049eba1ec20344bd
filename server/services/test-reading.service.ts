import { performance } from 'node:perf_hooks';
import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { loggersRepo } from '../db/loggers.repo.ts';
import { channelsRepo } from '../db/channels.repo.ts';
import { readingsRepo } from '../db/readings.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { NotFoundError } from '../errors.ts';
import { ConflictError } from './service-errors.ts';
import type { IngestHooks } from './ingest/ingest-hooks.ts';
import { ingestBatch, type IngestOutcome } from './ingest/ingest-batch.ts';
import type { Actor, LabContext } from './lab-context.ts';

/** What a test reading did: what was sent, what ingestion said, and what the database now holds. */
export interface TestReadingResult {
  sent: { channel: string; ts: string; value: number };
  outcome: IngestOutcome;
  /** The value read back from `readings` for that channel and time; null when nothing was stored. */
  storedValue: number | null;
  /** Wall time from handing the row to ingestion until it was read back, in milliseconds. */
  roundTripMs: number;
}

/**
 * "Send a test reading" from a logger's page: one reading of one channel at the current time,
 * stored through the very ingestion path a logger uses (`ingestBatch`, source `api`), then read
 * back from the database, so a technician sees the whole round trip work before wiring a logger.
 */
export function createTestReadingService(deps: { db: Db; now?: () => number; hooks?: IngestHooks }) {
  const now = deps.now ?? Date.now;
  return {
    /** Stores `value` for `channel` of the logger at "now", reads it back and audit-logs the attempt. */
    async send(lab: LabContext, actor: Actor, loggerId: number, input: { channel: string; value: number }): Promise<TestReadingResult> {
      const scope = inLab(deps.db, lab.id);
      const logger = await loggersRepo(scope).find(loggerId);
      if (!logger) throw new NotFoundError('No such logger in this lab.');
      if (logger.retiredAt) throw new ConflictError('logger_retired', 'This logger is retired: it accepts no new readings.');

      const ts = now();
      const started = performance.now();
      const outcome = await ingestBatch(
        deps.db,
        { tenantId: lab.id, loggerId },
        [{ index: 0, channel: input.channel, ts, value: input.value, raw: JSON.stringify({ channel: input.channel, ts, value: input.value }) }],
        { source: 'api', now, hooks: deps.hooks },
      );
      const channel = (await channelsRepo(scope).listForLogger(loggerId, { includeRetired: true })).find((c) => c.key === input.channel);
      const storedValue = channel ? ((await readingsRepo(scope).storedAt(channel.id, [ts])).get(ts) ?? null) : null;
      const roundTripMs = Math.round((performance.now() - started) * 10) / 10;

      const result = outcome.quarantined[0];
      await auditRepo(scope).record({
        actorUserId: actor.id,
        action: 'logger.test-reading',
        targetType: 'logger',
        targetId: loggerId,
        summary: result
          ? `${actor.displayName} sent a test reading of "${input.channel}" to "${logger.name}"; it was quarantined (${result.code})`
          : `${actor.displayName} sent a test reading of "${input.channel}" to "${logger.name}"`,
        details: { channel: input.channel, ts, value: input.value, accepted: outcome.accepted, quarantined: result?.code ?? null },
      });
      return { sent: { channel: input.channel, ts: new Date(ts).toISOString(), value: input.value }, outcome, storedValue, roundTripMs };
    },
  };
}

export type TestReadingService = ReturnType<typeof createTestReadingService>;
