import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { quarantineRepo, type QuarantineCursor, type QuarantineFilter, type QuarantinedRow } from '../db/quarantine.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { NotFoundError } from '../errors.ts';
import type { IngestHooks, StoredBatch } from './ingest/ingest-hooks.ts';
import { ingestBatchInTransaction, type IngestOutcome } from './ingest/ingest-batch.ts';
import { retryOnLockConflict } from './quarantine/retry-on-lock-conflict.ts';
import type { LogWriter } from '../log-writer.ts';
import type { Actor, LabContext } from './lab-context.ts';
import { replacing } from './quarantine/bulk-apply.ts';
import { createQuarantineBulk } from './quarantine/bulk-runs.ts';

export interface ResubmitRow {
  id: number;
  channel: string;
  ts: string | number;
  value: string | number;
}

/**
 * Reviewing quarantined rows: list and filter, export, discard (audit-logged), or fix and
 * re-submit; and the bulk repairs of `quarantine/` (`bulk`). A re-submitted row goes through
 * exactly the same checks as a logger's; if it fails again it returns to quarantine with its
 * new reason, so nothing is ever lost.
 */
export function createQuarantineService(deps: { db: Db; now?: () => number; hooks?: IngestHooks; logger?: LogWriter }) {
  return {
    bulk: createQuarantineBulk(deps),

    /**
     * One page of matching rows after `after` (keyset pagination: each page costs the same however
     * deep it is), with the number of matching rows counted up to QUARANTINE_COUNT_LIMIT.
     */
    async list(lab: LabContext, filter: QuarantineFilter & { after?: QuarantineCursor; pageSize: number }) {
      const repo = quarantineRepo(inLab(deps.db, lab.id));
      const page = await repo.page(filter);
      const total = await repo.countUpTo(filter);
      return { ...page, total: total.count, totalAtLeast: total.atLeast };
    },

    /** Every matching row, 5,000 at a time along the same keyset (for CSV export). */
    async *all(lab: LabContext, filter: QuarantineFilter): AsyncGenerator<QuarantinedRow[]> {
      const repo = quarantineRepo(inLab(deps.db, lab.id));
      let after: QuarantineCursor | undefined;
      for (;;) {
        const page = await repo.page({ ...filter, after, pageSize: 5000 });
        if (page.rows.length > 0) yield page.rows;
        if (!page.nextCursor) return;
        after = page.nextCursor;
      }
    },

    async discard(lab: LabContext, actor: Actor, ids: number[]): Promise<number> {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const found = new Set((await quarantineRepo(scope).findMany(ids)).map((r) => r.id));
        const missing = ids.filter((id) => !found.has(id));
        if (missing.length) throw new NotFoundError(rowsGone(missing.length));
        const removed = await quarantineRepo(scope).remove(ids);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'quarantine.discarded',
          summary: `${actor.displayName} discarded ${removed} quarantined row(s)`,
          details: { count: removed },
        });
        return removed;
      });
    },

    async resubmit(lab: LabContext, actor: Actor, rows: ResubmitRow[]): Promise<IngestOutcome & { resubmitted: number }> {
      const repo = quarantineRepo(inLab(deps.db, lab.id));
      const originals = new Map((await repo.findMany(rows.map((r) => r.id))).map((o) => [o.id, o]));
      const missing = rows.filter((r) => !originals.has(r.id) || originals.get(r.id)!.loggerId === null);
      if (missing.length) throw new NotFoundError(rowsGone(missing.length));
      const byLogger = new Map<number, Array<{ row: ResubmitRow; index: number }>>();
      rows.forEach((row, index) => {
        const loggerId = originals.get(row.id)!.loggerId!;
        (byLogger.get(loggerId) ?? byLogger.set(loggerId, []).get(loggerId)!).push({ row, index });
      });
      // One transaction for the new readings, the rows that fail again and the removal of the
      // originals: a failure anywhere leaves every original where it was.
      const { total, stored } = await retryOnLockConflict(() =>
        deps.db.transaction(
          async (trx) => {
            const scope = inLab(trx as unknown as Db, lab.id);
            const total: IngestOutcome = { accepted: 0, duplicates: 0, quarantined: [] };
            const stored: StoredBatch[] = [];
            for (const loggerId of [...byLogger.keys()].sort((a, b) => a - b)) {
              const list = byLogger.get(loggerId)!;
              const result = await ingestBatchInTransaction(
                trx as unknown as Db,
                { tenantId: lab.id, loggerId },
                list.map(({ row, index }) => ({ index, channel: row.channel, ts: row.ts, value: row.value, raw: JSON.stringify(row) })),
                { source: 'resubmit', now: deps.now, hooks: deps.hooks && replacing(deps.hooks, list.length) },
              );
              total.accepted += result.outcome.accepted;
              total.duplicates += result.outcome.duplicates;
              total.quarantined.push(...result.outcome.quarantined);
              if (result.stored.accepted > 0) stored.push(result.stored);
            }
            await quarantineRepo(scope).remove(rows.map((r) => r.id));
            await auditRepo(scope).record({
              actorUserId: actor.id,
              action: 'quarantine.resubmitted',
              summary: `${actor.displayName} re-submitted ${rows.length} quarantined row(s): ${total.accepted} stored, ${total.quarantined.length} quarantined again`,
              details: { accepted: total.accepted, duplicates: total.duplicates, quarantinedAgain: total.quarantined.length },
            });
            return { total, stored };
          },
          { isolationLevel: 'read committed' },
        ),
      );
      for (const batch of stored) deps.hooks?.afterCommit?.(batch);
      total.quarantined.sort((a, b) => a.index - b.index);
      return { ...total, resubmitted: rows.length };
    },
  };
}

export type QuarantineService = ReturnType<typeof createQuarantineService>;

/** The refusal for chosen rows that are no longer in quarantine: how many, never their ids. */
function rowsGone(n: number): string {
  return `${n === 1 ? 'One of the chosen rows is' : `${n.toLocaleString('en-GB')} of the chosen rows are`} no longer in quarantine (repaired or discarded meanwhile?); reload the list and choose again.`;
}
