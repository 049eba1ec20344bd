import type { Db } from '../../db/create-db.ts';
import { inLab, type LabScope } from '../../db/tenant-scope.ts';
import { quarantineRepo, type QuarantinedRow } from '../../db/quarantine.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import { channelsRepo } from '../../db/channels.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { NotFoundError } from '../../errors.ts';
import { BULK_MAX_ROWS, type BulkAction, type BulkCounts, type BulkSampleRow, type BulkSelection } from '../../contract/quarantine.ts';
import type { AuditAction } from '../../contract/audit.ts';
import { ingestBatchInTransaction } from '../ingest/ingest-batch.ts';
import { readRowTime } from '../ingest/check-rows.ts';
import type { IngestHooks, StoredBatch } from '../ingest/ingest-hooks.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import { groupReasons, incomingOf, planBulk, type BulkLogger, type BulkPlan } from './bulk-plan.ts';
import { filterOf } from './filter-of.ts';
import { QUARANTINE_LABELS } from '../../contract/words/quarantine.ts';
import { fieldRefusal } from '../service-errors.ts';

/** Rows sent through ingestion per batch (and between two progress reports). */
export const BULK_CHUNK = 500;
/** Rows shown before → after in a preview. */
const SAMPLE = 20;

/** One audit action per bulk repair. */
export const BULK_AUDIT_ACTIONS = {
  reread: 'quarantine.bulk-reread',
  shift: 'quarantine.bulk-shifted',
  'map-channel': 'quarantine.bulk-channel-mapped',
  discard: 'quarantine.bulk-discarded',
} as const satisfies Record<BulkAction['kind'], AuditAction>;

/** The rows a repair reaches, with their loggers, checked and planned (see `planBulk`). */
export interface BulkTarget {
  rows: QuarantinedRow[];
  loggers: Map<number, BulkLogger>;
  plan: BulkPlan;
}

/**
 * Finds the selected rows (a filter of the list, or ids) and checks the action against them:
 * 400 for more than BULK_MAX_ROWS and every refusal of `planBulk`; 404 for ids that are not in
 * this lab's quarantine (as for a single discard, another lab's ids stay unknown). With `lock`, inside a transaction, the rows' loggers are locked first (in id
 * order, as ingestion locks a logger before the lab's billing row), then the billing row, then
 * the rows, so a repair and a logger's batch never wait on each other in a circle.
 */
export async function resolveBulkTarget(scope: LabScope, selection: BulkSelection, action: BulkAction, now: number, lock = false): Promise<BulkTarget> {
  const repo = quarantineRepo(scope);
  let ids: number[];
  if (selection.ids) {
    ids = [...new Set(selection.ids)];
  } else {
    ids = await repo.idsMatching(filterOf(selection.filter ?? {}), BULK_MAX_ROWS + 1);
    if (ids.length > BULK_MAX_ROWS) {
      throw fieldRefusal(
        'selection',
        QUARANTINE_LABELS.selection,
        `more than ${BULK_MAX_ROWS.toLocaleString('en-GB')} rows match; narrow the filters (logger, reason, time received) and repair in parts`,
      );
    }
  }
  let rows = await repo.findMany(ids);
  if (selection.ids && rows.length < ids.length) {
    const found = new Set(rows.map((r) => r.id));
    const gone = ids.filter((id) => !found.has(id));
    throw new NotFoundError(
      `${gone.length === 1 ? 'One of the chosen rows is' : `${gone.length.toLocaleString('en-GB')} of the chosen rows are`} no longer in quarantine (repaired or discarded meanwhile?); reload the list and choose again.`,
    );
  }
  const loggerIds = [...new Set(rows.map((r) => r.loggerId).filter((id): id is number => id !== null))].sort((a, b) => a - b);
  const loggers = new Map<number, BulkLogger>();
  for (const id of loggerIds) {
    const l = await loggersRepo(scope).find(id, { lock: lock && action.kind !== 'discard' });
    if (l) loggers.set(id, { id, name: l.name, timezone: l.timezone });
  }
  if (lock) {
    await repo.lockCount();
    rows = await repo.findMany(
      rows.map((r) => r.id),
      { lock: true },
    );
    // keep the selection's order (the list's), whatever order the locking read returned
    const at = new Map(ids.map((id, i) => [id, i]));
    rows.sort((a, b) => at.get(a.id)! - at.get(b.id)!);
  }
  let channel = null;
  if (action.kind === 'map-channel') {
    const c = await channelsRepo(scope).find(action.channelId);
    if (c) {
      channel = { id: c.id, loggerId: c.loggerId, key: c.key, retiredAt: c.retiredAt };
      if (!loggers.has(c.loggerId)) {
        const owner = await loggersRepo(scope).find(c.loggerId);
        if (owner) loggers.set(owner.id, { id: owner.id, name: owner.name, timezone: owner.timezone });
      }
    }
  }
  return { rows, loggers, plan: planBulk(action, rows, loggers, channel, now) };
}

/** What applying a repair did: its counts, the first rows before → after, and the batches stored (for the after-commit hooks). */
export interface BulkApplied {
  counts: BulkCounts;
  sample: BulkSampleRow[];
  stored: StoredBatch[];
}

const before = (r: QuarantinedRow): BulkSampleRow['before'] => ({ channel: r.channelKey, ts: r.tsRaw, value: r.valueRaw, reasonCode: r.reasonCode });

/**
 * The hooks for a batch that replaces `originals` quarantined rows (removed right after it in
 * the same transaction): the rows of the batch that fail again replace those originals, so the
 * quarantine cap and the plan's quarantine limit see only the net growth, and a lab at its cap
 * can still fix its rows.
 */
export function replacing(hooks: IngestHooks, originals: number): IngestHooks {
  return {
    beforeCommit: hooks.beforeCommit && ((trx, batch) => hooks.beforeCommit!(trx, { ...batch, replacesQuarantined: originals })),
    afterCommit: hooks.afterCommit && ((batch) => hooks.afterCommit!(batch)),
  };
}

/**
 * Applies a checked repair on the caller's transaction: every row ends stored (new, or already
 * stored with the same value), back in quarantine with its new reason (its text as first
 * received kept), or discarded; one audit event records the action, the selection and the
 * counts (and the reason of a discard). Rows go through ingestion in batches of BULK_CHUNK, one
 * logger at a time, and `onProgress` hears after each. Nothing commits here: a failure anywhere
 * leaves every row where it was once the caller's transaction rolls back. The `afterCommit`
 * hooks of the stored batches are the caller's to run after its COMMIT.
 */
export async function applyBulk(
  trx: Db,
  lab: LabContext,
  actor: Actor,
  request: { selection: BulkSelection; action: BulkAction; batchRef: string },
  target: BulkTarget,
  opts: { hooks?: IngestHooks; now: () => number; onProgress?: (done: number) => Promise<void> },
): Promise<BulkApplied> {
  const scope = inLab(trx, lab.id);
  const { rows, plan } = target;
  const counts: BulkCounts = { selected: rows.length, stored: 0, alreadyStored: 0, stillQuarantined: 0, discarded: 0, reasons: [] };
  const sample: BulkSampleRow[] = [];
  const stored: StoredBatch[] = [];
  if (plan.kind === 'discard') {
    counts.discarded = await quarantineRepo(scope).remove(rows.map((r) => r.id));
    for (const r of rows.slice(0, SAMPLE)) sample.push({ id: r.id, before: before(r), after: { outcome: 'discarded' } });
    await opts.onProgress?.(rows.length);
  } else {
    const failedAgain: Array<{ code: string; reason: string }> = [];
    const sampleIds = new Set(rows.slice(0, SAMPLE).map((r) => r.id));
    const after = new Map<number, BulkSampleRow['after']>();
    let done = 0;
    const byLogger = new Map<number, QuarantinedRow[]>();
    for (const r of rows) (byLogger.get(r.loggerId!) ?? byLogger.set(r.loggerId!, []).get(r.loggerId!)!).push(r);
    for (const loggerId of [...byLogger.keys()].sort((a, b) => a - b)) {
      const list = byLogger.get(loggerId)!;
      const reading = plan.readingFor(target.loggers.get(loggerId)!);
      for (let i = 0; i < list.length; i += BULK_CHUNK) {
        const chunk = list.slice(i, i + BULK_CHUNK);
        const incoming = chunk.map((r, index) => incomingOf(r, plan.channelOf(r), index));
        const result = await ingestBatchInTransaction(trx, { tenantId: lab.id, loggerId }, incoming, {
          source: 'resubmit',
          batchRef: request.batchRef,
          ...reading,
          now: opts.now,
          hooks: opts.hooks && replacing(opts.hooks, chunk.length),
        });
        await quarantineRepo(scope).remove(chunk.map((r) => r.id));
        if (result.stored.accepted > 0) stored.push(result.stored);
        counts.stored += result.outcome.accepted;
        counts.alreadyStored += result.outcome.duplicates;
        const again = new Map(result.outcome.quarantined.map((q) => [q.index, q]));
        failedAgain.push(...result.outcome.quarantined);
        chunk.forEach((r, index) => {
          if (!sampleIds.has(r.id)) return;
          const q = again.get(index);
          const t = readRowTime(incoming[index].ts, reading);
          after.set(
            r.id,
            q
              ? { outcome: 'quarantined', reasonCode: q.code, reason: q.reason }
              : { outcome: 'stored', channel: String(incoming[index].channel), ts: t.ok ? new Date(t.ts).toISOString() : '' },
          );
        });
        done += chunk.length;
        await opts.onProgress?.(done);
      }
    }
    counts.stillQuarantined = failedAgain.length;
    counts.reasons = groupReasons(failedAgain);
    for (const r of rows.slice(0, SAMPLE)) sample.push({ id: r.id, before: before(r), after: after.get(r.id)! });
  }
  await auditRepo(scope).record({
    actorUserId: actor.id,
    action: BULK_AUDIT_ACTIONS[request.action.kind],
    summary: auditSummary(actor, request.action, counts),
    details: { action: request.action, selection: request.selection.ids ? { ids: request.selection.ids.length } : request.selection, counts },
  });
  return { counts, sample, stored };
}

function auditSummary(actor: Actor, action: BulkAction, c: BulkCounts): string {
  if (action.kind === 'discard') return `${actor.displayName} discarded ${c.discarded} quarantined row(s): ${action.reason}`;
  const what =
    action.kind === 'reread'
      ? `re-read the times of ${c.selected} quarantined row(s) as ${action.timeFormat === 'pattern' ? action.timePattern : action.timeFormat}`
      : action.kind === 'shift'
        ? `shifted the times of ${c.selected} quarantined row(s) by ${action.offsetMinutes > 0 ? '+' : ''}${action.offsetMinutes} min`
        : `mapped ${c.selected} quarantined row(s) to channel ${action.channelId}`;
  return `${actor.displayName} ${what}: ${c.stored + c.alreadyStored} stored, ${c.stillQuarantined} still quarantined`;
}
