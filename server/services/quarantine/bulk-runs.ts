import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { quarantineBulkRunsRepo, type BulkRunRow } from '../../db/quarantine-bulk-runs.repo.ts';
import { retryOnLockConflict } from './retry-on-lock-conflict.ts';
import { AppError, NotFoundError } from '../../errors.ts';
import { ConflictError } from '../service-errors.ts';
import type { BulkCounts, BulkPreview, BulkRequest, BulkRun } from '../../contract/quarantine.ts';
import type { LogWriter } from '../../log-writer.ts';
import type { IngestHooks, StoredBatch } from '../ingest/ingest-hooks.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import { applyBulk, resolveBulkTarget, type BulkApplied } from './bulk-apply.ts';

/** A running run whose heartbeat is older than this is taken as dead (its process stopped; MariaDB rolled its transaction back). */
export const BULK_STALE_MS = 2 * 60_000;
/** How often a running run writes its heartbeat, besides after each batch. */
const HEARTBEAT_MS = 15_000;
const STALE_MESSAGE = 'The server stopped while this repair worked; nothing was applied (its transaction was rolled back). Start it again.';

const runActive = () =>
  new ConflictError('bulk_run_active', 'A bulk repair is still working in this lab; wait for it to end (the page shows its progress), then try again.');

/** Thrown inside a preview's transaction to roll it back with the answer. */
class PreviewRollback extends Error {
  constructor(readonly applied: BulkApplied) {
    super('preview rollback');
  }
}

export interface BulkDeps {
  db: Db;
  now?: () => number;
  hooks?: IngestHooks;
  logger?: LogWriter;
}

function present(row: BulkRunRow): BulkRun {
  const request = JSON.parse(row.request) as BulkRequest;
  return {
    id: row.id,
    state: row.state,
    action: request.action,
    selection: request.selection,
    done: row.done,
    total: row.total,
    counts: row.outcome ? (JSON.parse(row.outcome) as BulkCounts) : null,
    error: row.error,
    startedBy: row.startedByName,
    startedAt: row.startedAt.toISOString(),
    finishedAt: row.finishedAt ? row.finishedAt.toISOString() : null,
  };
}

/** Runs each after-commit hook of the stored batches (they never throw: failures are the hook's own to log). */
function afterCommit(hooks: IngestHooks | undefined, stored: StoredBatch[]) {
  for (const s of stored) hooks?.afterCommit?.(s);
}

/**
 * Bulk repairs of a lab's quarantine: a preview that applies the repair in a transaction and
 * rolls it back (so the preview is exactly what applying would do at that moment), and runs
 * that apply it in one transaction in the background, with their progress in
 * `quarantine_bulk_runs` for the page to poll. One run per lab at a time (409 otherwise). A
 * run left `running` by a process that died is marked failed the next time the lab's runs are
 * read or a run is started, once its heartbeat is older than BULK_STALE_MS.
 */
export function createQuarantineBulk(deps: BulkDeps) {
  const now = deps.now ?? Date.now;
  const runs = (labId: number) => quarantineBulkRunsRepo(inLab(deps.db, labId));
  const failStale = (labId: number) => runs(labId).failStale(new Date(now() - BULK_STALE_MS), STALE_MESSAGE, new Date(now()));

  /** The repair in one READ COMMITTED transaction (as ingestion's), run again on a deadlock. */
  const inTransaction = <T>(work: (trx: Db) => Promise<T>): Promise<T> =>
    retryOnLockConflict(() => deps.db.transaction((trx) => work(trx as unknown as Db), { isolationLevel: 'read committed' }));

  async function work(lab: LabContext, actor: Actor, request: BulkRequest, runId: number) {
    const repo = runs(lab.id);
    const beat = setInterval(() => {
      repo.beat(runId, new Date(now())).catch(() => undefined);
    }, HEARTBEAT_MS);
    let done = 0;
    try {
      const applied = await inTransaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const target = await resolveBulkTarget(scope, request.selection, request.action, now(), true);
        const result = await applyBulk(trx, lab, actor, { ...request, batchRef: `bulk-${runId}` }, target, {
          hooks: deps.hooks,
          now,
          onProgress: async (n) => {
            done = n;
            await repo.progress(runId, n, new Date(now()));
          },
        });
        await quarantineBulkRunsRepo(scope).finish(runId, JSON.stringify(result.counts), result.counts.selected, new Date(now()));
        return result;
      });
      afterCommit(deps.hooks, applied.stored);
    } catch (err) {
      const message = err instanceof AppError ? err.message : 'The repair stopped on an unexpected error; nothing was applied. Try again, or report it.';
      if (!(err instanceof AppError)) deps.logger?.error('quarantine bulk repair failed', { runId, lab: lab.id, done, error: String(err) });
      await repo.fail(runId, message, new Date(now())).catch(() => undefined);
    } finally {
      clearInterval(beat);
    }
  }

  return {
    /** What the repair would do, applied and rolled back: counts, reasons, the first rows before → after. 400 for a repair that cannot be applied. */
    async preview(lab: LabContext, actor: Actor, request: BulkRequest): Promise<BulkPreview> {
      await failStale(lab.id);
      if (await runs(lab.id).running()) throw runActive();
      try {
        await inTransaction(async (trx) => {
          const target = await resolveBulkTarget(inLab(trx, lab.id), request.selection, request.action, now(), true);
          throw new PreviewRollback(await applyBulk(trx, lab, actor, { ...request, batchRef: 'bulk-preview' }, target, { hooks: deps.hooks, now }));
        });
      } catch (err) {
        if (err instanceof PreviewRollback) return { ...err.applied.counts, sample: err.applied.sample };
        throw err;
      }
      throw new Error('unreachable: a preview always rolls back');
    },

    /**
     * Starts applying the repair in the background and answers its run at once: the selection
     * and action are checked first (400 as for the preview), a lab with a run still working
     * answers 409. `whenDone` (tests) resolves once the run has ended.
     */
    async start(lab: LabContext, actor: Actor, request: BulkRequest): Promise<{ run: BulkRun; whenDone: Promise<void> }> {
      await failStale(lab.id);
      const target = await resolveBulkTarget(inLab(deps.db, lab.id), request.selection, request.action, now());
      const runId = await runs(lab.id).start({
        action: request.action.kind,
        request: JSON.stringify(request),
        startedBy: actor.id,
        startedByName: actor.displayName,
        total: target.rows.length,
        at: new Date(now()),
      });
      if (runId === null) throw runActive();
      const whenDone = work(lab, actor, request, runId);
      return { run: present((await runs(lab.id).find(runId))!), whenDone };
    },

    /** One run of the lab (404 for another lab's or an unknown id). */
    async get(lab: LabContext, runId: number): Promise<BulkRun> {
      await failStale(lab.id);
      const row = await runs(lab.id).find(runId);
      if (!row) throw new NotFoundError('No such bulk repair in this lab.');
      return present(row);
    },

    /** The lab's ten most recent runs, newest first. */
    async recent(lab: LabContext): Promise<BulkRun[]> {
      await failStale(lab.id);
      return (await runs(lab.id).recent(10)).map(present);
    },
  };
}

export type QuarantineBulk = ReturnType<typeof createQuarantineBulk>;
