import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { quarantineRepo, type QuarantineCursor, type QuarantineFilter, type QuarantinedRow } from '../db/quarantine.repo.ts';
import { auditRepo } from '../db/audit.repo.ts';
import { NotFoundError } from '../errors.ts';
import type { IngestHooks } from './ingest/ingest-hooks.ts';
import { ingestBatch, type IngestOutcome } from './ingest/ingest-batch.ts';
import type { Actor, LabContext } from './lab-context.ts';

export interface ResubmitRow {
  id: number;
  channel: string;
  ts: string | number;
  value: string | number;
}

/**
 * The hooks for a re-submit of `originals` quarantined rows: the batch's rows that fail again
 * replace those originals (removed right after), so the quarantine cap sees only the net growth
 * and a lab at its cap can still fix its rows.
 */
function replacing(hooks: IngestHooks, originals: number): IngestHooks {
  return {
    beforeCommit: hooks.beforeCommit && ((trx, batch) => hooks.beforeCommit!(trx, { ...batch, replacesQuarantined: originals })),
    afterCommit: hooks.afterCommit && ((batch) => hooks.afterCommit!(batch)),
  };
}

/**
 * Reviewing quarantined rows: list and filter, export, discard (audit-logged), or fix and
 * re-submit. A re-submitted row goes through exactly the same checks as a logger's; if it
 * fails again it returns to quarantine with its new reason, so nothing is ever lost.
 */
export function createQuarantineService(deps: { db: Db; now?: () => number; hooks?: IngestHooks }) {
  return {
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
        if (missing.length) throw new NotFoundError(`No such quarantined row in this lab: ${missing.join(', ')}.`);
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
      if (missing.length) throw new NotFoundError(`No such quarantined row in this lab: ${missing.map((m) => m.id).join(', ')}.`);
      const byLogger = new Map<number, Array<{ row: ResubmitRow; index: number }>>();
      rows.forEach((row, index) => {
        const loggerId = originals.get(row.id)!.loggerId!;
        (byLogger.get(loggerId) ?? byLogger.set(loggerId, []).get(loggerId)!).push({ row, index });
      });
      const total: IngestOutcome = { accepted: 0, duplicates: 0, quarantined: [] };
      for (const [loggerId, list] of byLogger) {
        const outcome = await ingestBatch(
          deps.db,
          { tenantId: lab.id, loggerId },
          list.map(({ row, index }) => ({ index, channel: row.channel, ts: row.ts, value: row.value, raw: JSON.stringify(row) })),
          { source: 'resubmit', now: deps.now, hooks: deps.hooks && replacing(deps.hooks, list.length) },
        );
        total.accepted += outcome.accepted;
        total.duplicates += outcome.duplicates;
        total.quarantined.push(...outcome.quarantined);
      }
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        await quarantineRepo(scope).remove(rows.map((r) => r.id));
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'quarantine.resubmitted',
          summary: `${actor.displayName} re-submitted ${rows.length} quarantined row(s): ${total.accepted} stored, ${total.quarantined.length} quarantined again`,
          details: { accepted: total.accepted, duplicates: total.duplicates, quarantinedAgain: total.quarantined.length },
        });
      });
      total.quarantined.sort((a, b) => a.index - b.index);
      return { ...total, resubmitted: rows.length };
    },
  };
}

export type QuarantineService = ReturnType<typeof createQuarantineService>;
