/**
 * "New" in `npm run bench:storage`: the schema every migration of the current tree makes, a lab
 * on the largest plan, one logger with its channels (60 s interval) made through the loggers
 * service, and readings stored through Lagbook's own ingestion path — `ingestBatch`, the function
 * behind POST /api/v1/ingest, with the quarantine cap and plan-limit hooks the app passes — on a
 * simulated clock that follows the data (the readings lie in a future year so the month
 * partitions the background job makes ahead are there to receive them).
 */
import { createDb, type Db } from '../../../server/db/create-db.ts';
import { migrateToLatest } from '../../../server/db/migrate.ts';
import { labsRepo } from '../../../server/db/labs.repo.ts';
import { inLab } from '../../../server/db/tenant-scope.ts';
import { usageRepo } from '../../../server/db/usage.repo.ts';
import { channelReadingsRepo } from '../../../server/db/channel-readings.repo.ts';
import { ensureMonthsUpTo, isPartitioned, PARTITIONED_TABLES } from '../../../server/db/reading-partitions.ts';
import { createLoggersService } from '../../../server/services/loggers.service.ts';
import { createChannelsService } from '../../../server/services/channels.service.ts';
import { ingestBatch, type IncomingReading } from '../../../server/services/ingest/ingest-batch.ts';
import { composeIngestHooks, type IngestHooks } from '../../../server/services/ingest/ingest-hooks.ts';
import { quarantineCapHook } from '../../../server/services/ingest/quarantine-cap.ts';
import { createPlanLimits } from '../../../server/services/billing/plan-limits.ts';
import { loadPlanCatalog } from '../../../server/services/billing/plan-catalog.ts';
import type { LabContext } from '../../../server/services/lab-context.ts';
import type { LogWriter } from '../../../server/log-writer.ts';
import { onLargestPlan } from '../../support/largest-plan.ts';
import { MINUTE_MS, type ReadingBatch } from './storage-data.ts';
import { join } from 'node:path';

const PLANS_FILE = join(import.meta.dirname, '..', '..', '..', 'tenants', 'plans.json');

/** Log lines of the app's code during the benchmark: warnings and errors shown, info dropped. */
export const benchLog: LogWriter = {
  info: () => undefined,
  warn: (msg, fields) => console.warn(`  [warn] ${msg} ${fields ? JSON.stringify(fields) : ''}`),
  error: (msg, fields) => console.error(`  [error] ${msg} ${fields ? JSON.stringify(fields) : ''}`),
};

export interface NewSchema {
  db: Db;
  lab: LabContext;
  loggerId: number;
  /** Channel id of each channel index. */
  channelIds: number[];
  /** Whether the migrations made `readings` partitioned (false until the partition migration is in the tree). */
  partitioned: boolean;
  /** The simulated clock (epoch ms): the time of the newest reading stored so far plus a minute. */
  now(): number;
  setNow(ms: number): void;
  /** Stores one batch through `ingestBatch`; returns how many readings were accepted (throws when any row was refused). */
  store(batch: ReadingBatch): Promise<number>;
  rawRange(channelId: number, from: number, to: number): Promise<number>;
  series(channelId: number, from: number, to: number, points: number): Promise<number>;
  storedReadings(): Promise<number>;
  close(): Promise<void>;
}

/**
 * Migrates `database` (reached through `socketPath`), makes the lab, logger and `channels`
 * channels, and — when the tables are partitioned — month partitions up to `lastReadingMs`, as
 * the storage maintenance job would have made them month by month while the data came in.
 */
export async function createNewSchema(socketPath: string, database: string, channels: number, lastReadingMs: number): Promise<NewSchema> {
  const db = createDb({ host: '127.0.0.1', port: 0, socketPath, user: 'lagbook', password: 'lagbook', database, poolMax: 10 });
  await migrateToLatest(db);
  const partitioned = await isPartitioned(db, 'readings');
  if (partitioned) for (const table of PARTITIONED_TABLES) await ensureMonthsUpTo(db, table, lastReadingMs);

  let simNow = 0;
  const lab: LabContext = { ...(await labsRepo(db).insert({ slug: 'storage-bench-lab', name: 'Storage bench lab' })), role: 'admin' };
  await onLargestPlan(db, lab.id);
  const { logger } = await createLoggersService({ db }).register(lab, null, {
    name: 'Ridge station',
    timezone: 'UTC',
    expectedIntervalS: 60,
    channels: Array.from({ length: channels }, (_, c) => ({ key: `c${c}`, label: `Probe ${c + 1}` })),
  });
  const channelIds = logger.channels.map((c) => c.id);
  const planLimits = createPlanLimits({ db, catalog: loadPlanCatalog(PLANS_FILE), logger: benchLog, now: () => new Date(simNow) });
  // the hooks every way a reading comes in runs (server/app.ts), less alerts: the lab has no rules
  const hooks: IngestHooks = composeIngestHooks([quarantineCapHook(), planLimits.ingestHooks]);
  const channelsService = createChannelsService({ db, now: () => simNow });
  const scope = inLab(db, lab.id);

  return {
    db,
    lab,
    loggerId: logger.id,
    channelIds,
    partitioned,
    now: () => simNow,
    setNow: (ms) => void (simNow = ms),
    async store(batch) {
      const rows: IncomingReading[] = new Array(batch.length);
      let newest = 0;
      for (let i = 0; i < batch.length; i++) {
        rows[i] = { index: i, channel: `c${batch.channel[i]}`, ts: batch.ts[i], value: batch.value[i] };
        if (batch.ts[i] > newest) newest = batch.ts[i];
      }
      simNow = newest + MINUTE_MS;
      const outcome = await ingestBatch(db, { tenantId: lab.id, loggerId: logger.id }, rows, { source: 'api', now: () => simNow, hooks });
      if (outcome.quarantined.length > 0) throw new Error(`ingestion refused ${outcome.quarantined.length} rows, e.g. ${outcome.quarantined[0].reason}`);
      return outcome.accepted;
    },
    async rawRange(channelId, from, to) {
      return (await channelReadingsRepo(scope).range(channelId, from, to)).ts.length;
    },
    async series(channelId, from, to, points) {
      const s = await channelsService.series(lab, channelId, { from, to, points });
      return s.t.length;
    },
    storedReadings: () => usageRepo(scope).storedReadings(),
    close: () => db.destroy(),
  };
}
