import type { Db } from '../db/create-db.ts';
import { inLab } from '../db/tenant-scope.ts';
import { createReadReplica, type ReadReplica } from '../db/read-replica.ts';
import { labOverviewRepo, type LoggerSinceRow } from '../db/lab-overview.repo.ts';
import { channelStateRepo, type ChannelWithState } from '../db/channel-state.repo.ts';
import { labBillingRepo } from '../db/lab-billing.repo.ts';
import { can, type Permission } from '../policies/permissions.ts';
import type { ChannelStatus } from '../contract/channels.ts';
import type { AuditAction } from '../contract/audit.ts';
import {
  OVERVIEW_LIST_LIMIT,
  type FirstStep,
  type LabOverviewAnswer,
  type OverviewChannel,
  type OverviewChannels,
  type OverviewKeys,
  type OverviewLoggerKey,
  type OverviewPlan,
  type OverviewQuarantine,
  type OverviewUpload,
  type PlanMeasure,
} from '../contract/overview.ts';
import { channelStatus } from './channels.service.ts';
import { warningLevel } from './billing/usage-job.ts';
import type { BillingService } from './billing/billing.service.ts';
import type { LabContext } from './lab-context.ts';

/** The audit action a finished (or stopped) history upload is recorded under; the overview reads the latest. */
export const UPLOAD_AUDIT_ACTION: AuditAction = 'logger.uploaded';

/** Open alerts listed on the overview (the count covers all of them). */
const RECENT_ALERTS = 5;
/** Quarantine reasons looked up (more than ingestion writes today). */
const QUARANTINE_REASONS = 12;
/** Each reason's rows are counted up to this many ("1,000 or more"): the kept counter gives the exact total. */
const REASON_COUNT_CAP = 1000;

const iso = (ms: number) => new Date(ms).toISOString();
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : 0);

function overviewChannel(c: ChannelWithState, status: ChannelStatus, intervalS: number): OverviewChannel {
  return {
    id: c.id,
    key: c.key,
    label: c.label,
    quantity: c.quantity,
    unit: c.unit,
    logger: { id: c.logger.id, name: c.logger.name },
    status,
    intervalS,
    lastReading: c.lastReadingTs === null || c.lastReadingValue === null ? null : { time: iso(c.lastReadingTs), value: c.lastReadingValue },
    validMin: c.validMin,
    validMax: c.validMax,
  };
}

/**
 * The channels part: every channel in use judged by the channels page's own rule
 * (`channelStatus`: silent after 3 expected intervals, else out of range by the last value), so the
 * overview and the channels table never disagree. Silent ones longest-quiet first; out-of-range ones
 * most recent first; each list cut at OVERVIEW_LIST_LIMIT (the counts say how many there are).
 */
export function channelsPart(channels: ChannelWithState[], nowMs: number): OverviewChannels {
  const counts: Record<ChannelStatus, number> = { live: 0, silent: 0, 'out-of-range': 0, 'no-data': 0 };
  const silent: OverviewChannel[] = [];
  const outOfRange: OverviewChannel[] = [];
  for (const c of channels) {
    const { status, intervalS } = channelStatus(c, nowMs);
    counts[status] += 1;
    if (status === 'silent') silent.push(overviewChannel(c, status, intervalS));
    if (status === 'out-of-range') outOfRange.push(overviewChannel(c, status, intervalS));
  }
  const at = (c: OverviewChannel) => (c.lastReading ? Date.parse(c.lastReading.time) : 0);
  silent.sort((a, b) => at(a) - at(b));
  outOfRange.sort((a, b) => at(b) - at(a));
  return { total: channels.length, counts, silent: silent.slice(0, OVERVIEW_LIST_LIMIT), outOfRange: outOfRange.slice(0, OVERVIEW_LIST_LIMIT) };
}

/** The steps an empty lab is offered, each only when the role may take it. */
export function firstStepsFor(may: (p: Permission) => boolean): FirstStep[] {
  const steps: FirstStep[] = [];
  if (may('loggers.manage')) steps.push('register-logger');
  if (may('invitations.manage')) steps.push('invite-colleague');
  if (may('uploads.create') && may('loggers.manage')) steps.push('upload-history');
  return steps;
}

const loggerKey = (r: LoggerSinceRow): OverviewLoggerKey => ({ logger: { id: r.loggerId, name: r.loggerName }, since: r.since.toISOString() });

/**
 * A lab's overview: what needs attention (silent and out-of-range channels, open alerts,
 * quarantine, unused keys, usage against the plan, the last upload), each part read only when
 * the caller's role may see it (server/policies/permissions.ts). Bounded reads only: channel
 * state and counters ingestion keeps, indexed lists with a LIMIT, never the readings. The channel
 * list comes through `reads` (the reader when its list of the lab's channels and loggers is the
 * writer's, see read-replica.ts); alerts, quarantine, keys, plan and uploads stay on the writer.
 */
export function createLabOverviewService(deps: { db: Db; reads?: ReadReplica; billing: Pick<BillingService, 'overview'>; now?: () => number }) {
  const now = deps.now ?? Date.now;
  const reads = deps.reads ?? createReadReplica({ writer: deps.db });

  async function quarantinePart(labId: number): Promise<OverviewQuarantine> {
    const scope = inLab(deps.db, labId);
    const waiting = (await labBillingRepo(scope).get())?.quarantinedCount ?? 0;
    if (waiting === 0) return { waiting, byReason: [] };
    const repo = labOverviewRepo(scope);
    const reasons = await repo.quarantineReasons(QUARANTINE_REASONS);
    const byReason = [];
    for (const r of reasons) {
      const { count, atLeast } = await repo.quarantinedWithReason(r.reason, REASON_COUNT_CAP);
      byReason.push({ reason: r.reason, count, atLeast, latestAt: r.latestAt.toISOString() });
    }
    return { waiting, byReason };
  }

  async function keysPart(labId: number): Promise<OverviewKeys> {
    const keys = await labOverviewRepo(inLab(deps.db, labId)).loggerKeys(OVERVIEW_LIST_LIMIT);
    return { ...keys, neverUsed: keys.neverUsed.map(loggerKey), withoutKey: keys.withoutKey.map(loggerKey) };
  }

  async function planPart(lab: LabContext): Promise<OverviewPlan> {
    const billing = await deps.billing.overview(lab);
    const measures: PlanMeasure[] = ['readings', 'loggers', 'members', 'quarantinedRows'];
    return {
      planName: billing.plan.name,
      ingestionRefused: billing.ingestionRefused,
      usage: measures.map((measure) => {
        const used = billing.usage[measure];
        const allowed = billing.limits[measure];
        return { measure, used, allowed, level: warningLevel(used, allowed) };
      }),
    };
  }

  async function lastUploadPart(labId: number): Promise<OverviewUpload | null> {
    const repo = labOverviewRepo(inLab(deps.db, labId));
    const event = await repo.latestEvent(UPLOAD_AUDIT_ACTION);
    if (!event) return null;
    const loggerId = Number(event.targetId);
    const logger = Number.isSafeInteger(loggerId) && loggerId > 0 ? await repo.loggerNameAndZone(loggerId) : null;
    const d = event.details ?? {};
    return {
      at: event.at.toISOString(),
      logger: logger === null ? null : { id: loggerId, ...logger },
      by: event.actorName === null ? null : { name: event.actorName },
      lines: num(d.lines),
      accepted: num(d.accepted),
      duplicates: num(d.duplicates),
      quarantined: num(d.quarantined),
      stopped: d.stopped === true,
    };
  }

  return {
    /** The overview as the caller's role may see it. */
    async overview(lab: LabContext): Promise<LabOverviewAnswer> {
      const may = (p: Permission) => can(lab.role, p);
      const scope = inLab(deps.db, lab.id);
      const at = now();
      const loggerCount = await labOverviewRepo(scope).activeLoggerCount();
      const empty = loggerCount === 0;
      const answer: LabOverviewAnswer = { now: iso(at), loggerCount, empty, firstSteps: empty ? firstStepsFor(may) : [] };
      if (may('channels.read')) {
        answer.channels = channelsPart(empty ? [] : await reads.listRead(lab.id, (db) => channelStateRepo(inLab(db, lab.id)).listActive()), at);
      }
      if (may('alerts.read')) {
        const open = await labOverviewRepo(scope).openAlerts(RECENT_ALERTS);
        answer.alerts = { openCount: open.count, recent: open.recent.map((a) => ({ ...a, openedAt: iso(a.openedAt) })) };
      }
      if (may('quarantine.review')) answer.quarantine = await quarantinePart(lab.id);
      if (may('ingest-keys.manage')) answer.keys = await keysPart(lab.id);
      if (may('billing.manage')) answer.plan = await planPart(lab);
      if (may('uploads.create')) answer.lastUpload = await lastUploadPart(lab.id);
      return answer;
    },
  };
}

export type LabOverviewService = ReturnType<typeof createLabOverviewService>;
