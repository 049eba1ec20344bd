/**
 * The background rebuild of closed months, as `npm run bench:storage` runs it on the "new"
 * schema: the storage maintenance job's `rebuildClosedMonths`
 * (server/services/storage/storage-maintenance-job.ts) at a simulated time after the data's last
 * month closed, so every month of the run is copied into a freshly packed, compressed partition
 * and swapped in as the running server would do it month by month.
 */
import { createStorageMaintenanceJob } from '../../../server/services/storage/storage-maintenance-job.ts';
import { benchLog, type NewSchema } from './storage-new-schema.ts';

export type RebuildOutcome = { ran: true; detail: string } | { ran: false; note: string };

/** Rebuilds every closed month of the new schema with the maintenance job, at the simulated time `nowMs`. */
export async function rebuildClosedMonths(schema: NewSchema, nowMs: number): Promise<RebuildOutcome> {
  if (!schema.partitioned) return { ran: false, note: 'readings is not partitioned in this tree' };
  schema.setNow(nowMs);
  const job = createStorageMaintenanceJob({
    db: schema.db,
    logger: benchLog,
    holder: 'storage-bench',
    now: () => new Date(schema.now()),
    afterStep: (step, name) => {
      if (step === 'put-back') console.log(`  rebuilt readings ${name}`);
    },
  });
  const { rebuilt, stopped } = await job.rebuildClosedMonths();
  if (stopped) throw new Error(`the rebuild stopped: ${stopped}`);
  if (rebuilt.length === 0) return { ran: false, note: 'no closed month to rebuild (use more --days)' };
  return { ran: true, detail: `${rebuilt.length} month(s) of readings rebuilt (${rebuilt[0]} … ${rebuilt[rebuilt.length - 1]})` };
}
