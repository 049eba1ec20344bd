import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';

export type BulkRunStateRow = 'running' | 'done' | 'failed';

/** One bulk quarantine repair as stored: the request and outcome are JSON texts the service reads. */
export interface BulkRunRow {
  id: number;
  state: BulkRunStateRow;
  action: string;
  request: string;
  startedBy: number | null;
  startedByName: string | null;
  total: number;
  done: number;
  outcome: string | null;
  error: string | null;
  startedAt: Date;
  heartbeatAt: Date;
  finishedAt: Date | null;
}

const COLUMNS = [
  'quarantine_bulk_runs.id',
  'quarantine_bulk_runs.state',
  'quarantine_bulk_runs.action',
  'quarantine_bulk_runs.request',
  'quarantine_bulk_runs.started_by as startedBy',
  'quarantine_bulk_runs.started_by_name as startedByName',
  'quarantine_bulk_runs.total',
  'quarantine_bulk_runs.done',
  'quarantine_bulk_runs.outcome',
  'quarantine_bulk_runs.error',
  'quarantine_bulk_runs.started_at as startedAt',
  'quarantine_bulk_runs.heartbeat_at as heartbeatAt',
  'quarantine_bulk_runs.finished_at as finishedAt',
];

const toRun = (r: Record<string, unknown>): BulkRunRow => ({
  ...(r as unknown as BulkRunRow),
  id: Number(r.id),
  startedBy: r.startedBy === null ? null : Number(r.startedBy),
  total: Number(r.total),
  done: Number(r.done),
});

/**
 * Data access for one lab's `quarantine_bulk_runs`. At most one run of a lab is `running`: the
 * row holds `running_slot = 1` while it runs (unique per lab), so a second `start` fails on the
 * key whatever the number of servers, and `finish`/`fail` free the slot.
 */
export function quarantineBulkRunsRepo(scope: LabScope) {
  return {
    /** Records a new running run; null when the lab already has one running. */
    async start(input: { action: string; request: string; startedBy: number; startedByName: string; total: number; at: Date }): Promise<number | null> {
      const id = newId();
      try {
        await scope.insert('quarantine_bulk_runs', {
          id,
          state: 'running',
          running_slot: 1,
          action: input.action,
          request: input.request,
          started_by: input.startedBy,
          started_by_name: input.startedByName.slice(0, 191),
          total: input.total,
          done: 0,
          started_at: input.at,
          heartbeat_at: input.at,
        });
      } catch (err) {
        if ((err as { code?: string } | null)?.code === 'ER_DUP_ENTRY') return null;
        throw err;
      }
      return id;
    },

    async find(id: number): Promise<BulkRunRow | null> {
      const row = await scope.table('quarantine_bulk_runs').where('quarantine_bulk_runs.id', id).first(COLUMNS);
      return row ? toRun(row) : null;
    },

    /** The lab's most recent runs, newest first. */
    async recent(limit: number): Promise<BulkRunRow[]> {
      const rows = await scope
        .table('quarantine_bulk_runs')
        .orderBy([
          { column: 'quarantine_bulk_runs.started_at', order: 'desc' },
          { column: 'quarantine_bulk_runs.id', order: 'desc' },
        ])
        .limit(limit)
        .select(COLUMNS);
      return rows.map(toRun);
    },

    /** Progress of a running run (its heartbeat too). */
    async progress(id: number, done: number, at: Date): Promise<void> {
      await scope
        .table('quarantine_bulk_runs')
        .where('quarantine_bulk_runs.id', id)
        .where('quarantine_bulk_runs.state', 'running')
        .update({ done, heartbeat_at: at });
    },

    /** The heartbeat of a running run: it is still working. */
    async beat(id: number, at: Date): Promise<void> {
      await scope
        .table('quarantine_bulk_runs')
        .where('quarantine_bulk_runs.id', id)
        .where('quarantine_bulk_runs.state', 'running')
        .update({ heartbeat_at: at });
    },

    /** The lab's running run, if any. */
    async running(): Promise<BulkRunRow | null> {
      const row = await scope.table('quarantine_bulk_runs').where('quarantine_bulk_runs.running_slot', 1).first(COLUMNS);
      return row ? toRun(row) : null;
    },

    /** Ends a run as done with its outcome (JSON), freeing the lab's running slot. */
    async finish(id: number, outcome: string, done: number, at: Date): Promise<void> {
      await scope
        .table('quarantine_bulk_runs')
        .where('quarantine_bulk_runs.id', id)
        .update({ state: 'done', running_slot: null, outcome, done, finished_at: at, heartbeat_at: at });
    },

    /** Ends a running run as failed with why, freeing the slot; false when it was no longer running. */
    async fail(id: number, error: string, at: Date): Promise<boolean> {
      const n = await scope
        .table('quarantine_bulk_runs')
        .where('quarantine_bulk_runs.id', id)
        .where('quarantine_bulk_runs.state', 'running')
        .update({ state: 'failed', running_slot: null, error: error.slice(0, 500), finished_at: at, heartbeat_at: at });
      return Number(n) > 0;
    },

    /** Marks failed every running run of the lab whose last heartbeat is before `staleBefore` (its process died); how many. */
    async failStale(staleBefore: Date, error: string, at: Date): Promise<number> {
      const n = await scope
        .table('quarantine_bulk_runs')
        .where('quarantine_bulk_runs.state', 'running')
        .where('quarantine_bulk_runs.heartbeat_at', '<', staleBefore)
        .update({ state: 'failed', running_slot: null, error: error.slice(0, 500), finished_at: at });
      return Number(n);
    },
  };
}

export type QuarantineBulkRunsRepo = ReturnType<typeof quarantineBulkRunsRepo>;
