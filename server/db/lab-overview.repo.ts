import type { OverviewAlert } from '../contract/overview.ts';
import type { LabScope } from './tenant-scope.ts';

/** An open alert with the names of what it watches (the answer's shape, opened at epoch ms). */
export type OpenAlertRow = Omit<OverviewAlert, 'openedAt'> & { openedAt: number };

/** A reason quarantined rows wait for, with when the latest of them came in. */
export interface QuarantineReasonRow {
  reason: string;
  latestAt: Date;
}

/** A logger in use with the date the overview names beside it. */
export interface LoggerSinceRow {
  loggerId: number;
  loggerName: string;
  since: Date;
}

/** An audit event of a finished upload, with the uploader's name. */
export interface UploadEventRow {
  at: Date;
  actorName: string | null;
  targetId: string | null;
  details: Record<string, unknown> | null;
}

const parseDetails = (v: unknown): Record<string, unknown> | null => {
  if (v === null || v === undefined) return null;
  if (typeof v === 'object') return v as Record<string, unknown>;
  try {
    return JSON.parse(String(v)) as Record<string, unknown>;
  } catch {
    return null;
  }
};

/**
 * The reads behind a lab's overview page. Every statement starts at the lab scope, reads along an
 * index that leads with tenant_id and is bounded by a LIMIT or by what a plan limits (rules,
 * loggers); none reads the readings table.
 */
export function labOverviewRepo(scope: LabScope) {
  return {
    /** Loggers in use (not retired); bounded by the plan's logger limit. */
    async activeLoggerCount(): Promise<number> {
      const row = await scope.table('loggers').whereNull('loggers.retired_at').count({ n: '*' }).first();
      return Number(row?.n ?? 0);
    },

    /**
     * Open alerts counted, and the newest `limit` of them with their channel and logger names. An
     * open alert holds its rule in `open_rule_id` (one per rule, unique index), so both read that
     * index's entries for the lab: at most one per rule.
     */
    async openAlerts(limit: number): Promise<{ count: number; recent: OpenAlertRow[] }> {
      const counted = await scope.table('alerts').whereNotNull('alerts.open_rule_id').count({ n: '*' }).first();
      const rows = await scope
        .table('alerts')
        .leftJoin('channels', (j) => j.on('channels.tenant_id', '=', 'alerts.tenant_id').andOn('channels.id', '=', 'alerts.channel_id'))
        .leftJoin('loggers', (j) => j.on('loggers.tenant_id', '=', 'alerts.tenant_id').andOn('loggers.id', '=', 'alerts.logger_id'))
        .whereNotNull('alerts.open_rule_id')
        .orderBy([
          { column: 'alerts.opened_at', order: 'desc' },
          { column: 'alerts.id', order: 'desc' },
        ])
        .limit(limit)
        .select(
          'alerts.id',
          'alerts.rule_name as ruleName',
          'alerts.opened_at as openedAt',
          'alerts.opened_detail as detail',
          'alerts.acknowledged_at as acknowledgedAt',
          'alerts.channel_id as channelId',
          'channels.label as channelLabel',
          'alerts.logger_id as loggerId',
          'loggers.name as loggerName',
        );
      return {
        count: Number(counted?.n ?? 0),
        recent: rows.map((r: Record<string, unknown>) => ({
          id: Number(r.id),
          ruleName: r.ruleName as string,
          openedAt: Number(r.openedAt),
          detail: r.detail as string,
          acknowledged: r.acknowledgedAt !== null && r.acknowledgedAt !== undefined,
          channel: r.channelId === null || r.channelLabel === null ? null : { id: Number(r.channelId), label: r.channelLabel as string },
          logger: r.loggerId === null || r.loggerName === null ? null : { id: Number(r.loggerId), name: r.loggerName as string },
        })),
      };
    },

    /**
     * The reasons quarantined rows wait for, each with its latest arrival, latest first, at most
     * `limit`: one entry per reason from `quarantine_reason_index` (tenant_id, reason_code,
     * received_at), read as MariaDB's loose index scan for GROUP BY … MAX() (one index dive per reason).
     */
    async quarantineReasons(limit: number): Promise<QuarantineReasonRow[]> {
      const rows = await scope
        .table('quarantined_rows')
        .groupBy('quarantined_rows.reason_code')
        .select('quarantined_rows.reason_code as reason')
        .max({ latestAt: 'quarantined_rows.received_at' });
      const reasons: QuarantineReasonRow[] = rows.map((r: Record<string, unknown>) => ({ reason: r.reason as string, latestAt: r.latestAt as Date }));
      return reasons.sort((a, b) => b.latestAt.getTime() - a.latestAt.getTime()).slice(0, limit);
    },

    /**
     * Loggers in use whose newest working key was never used by a logger, oldest key first, at
     * most `limit`, with their count. Bounded by the lab's loggers (a plan limit) and their keys.
     */
    async loggersWithUnusedKey(limit: number): Promise<{ count: number; rows: LoggerSinceRow[] }> {
      const rows = await scope
        .table('loggers')
        .join('ingest_keys', (j) => j.on('ingest_keys.tenant_id', '=', 'loggers.tenant_id').andOn('ingest_keys.logger_id', '=', 'loggers.id'))
        .whereNull('loggers.retired_at')
        .whereNull('ingest_keys.revoked_at')
        .groupBy('loggers.id', 'loggers.name')
        .havingRaw('MAX(ingest_keys.last_used_at) IS NULL')
        .select('loggers.id as loggerId', 'loggers.name as loggerName')
        .min({ since: 'ingest_keys.created_at' })
        .orderBy('since');
      return { count: rows.length, rows: rows.slice(0, limit).map(toLoggerSince) };
    },

    /** Loggers in use without a working (unrevoked) key, oldest first, at most `limit`, with their count. */
    async loggersWithoutKey(limit: number): Promise<{ count: number; rows: LoggerSinceRow[] }> {
      const rows = await scope
        .table('loggers')
        .whereNull('loggers.retired_at')
        .whereNotExists(function () {
          this.select(this.client.raw('1'))
            .from('ingest_keys')
            .whereRaw('ingest_keys.tenant_id = loggers.tenant_id AND ingest_keys.logger_id = loggers.id')
            .whereNull('ingest_keys.revoked_at');
        })
        .orderBy('loggers.created_at')
        .select('loggers.id as loggerId', 'loggers.name as loggerName', 'loggers.created_at as since');
      return { count: rows.length, rows: rows.slice(0, limit).map(toLoggerSince) };
    },

    /** The newest audit event of `action` with its actor's name (audit_events_action_index, one row). */
    async latestEvent(action: string): Promise<UploadEventRow | null> {
      const row = await scope
        .table('audit_events')
        .leftJoin('users as actor', 'actor.id', 'audit_events.actor_user_id')
        .where('audit_events.action', action)
        .orderBy([
          { column: 'audit_events.at', order: 'desc' },
          { column: 'audit_events.id', order: 'desc' },
        ])
        .first('audit_events.at', 'actor.display_name as actorName', 'audit_events.target_id as targetId', 'audit_events.details');
      if (!row) return null;
      return {
        at: row.at as Date,
        actorName: (row.actorName as string | null) ?? null,
        targetId: (row.targetId as string | null) ?? null,
        details: parseDetails(row.details),
      };
    },

    /** A logger's name by id (retired ones too), or null when it is not this lab's. */
    async loggerName(loggerId: number): Promise<string | null> {
      const row = await scope.table('loggers').where('loggers.id', loggerId).first('loggers.name');
      return row ? (row.name as string) : null;
    },
  };
}

function toLoggerSince(r: Record<string, unknown>): LoggerSinceRow {
  return { loggerId: Number(r.loggerId), loggerName: r.loggerName as string, since: r.since as Date };
}

export type LabOverviewRepo = ReturnType<typeof labOverviewRepo>;
