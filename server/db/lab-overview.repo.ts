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
     * open alert holds its rule in `open_rule_id` (one per rule, unique index
     * `alerts_one_open_per_rule`), so both read that index's entries for the lab: at most one per
     * rule, however many resolved alerts the lab keeps. The index is named because with few open
     * alerts the planner otherwise walks `alerts_opened_index` backwards through resolved ones.
     */
    async openAlerts(limit: number): Promise<{ count: number; recent: OpenAlertRow[] }> {
      const [counted] = (
        await scope.raw(
          'SELECT COUNT(*) AS n FROM alerts FORCE INDEX (alerts_one_open_per_rule) WHERE alerts.tenant_id = :lab AND alerts.open_rule_id IS NOT NULL',
        )
      )[0] as Array<{ n: number }>;
      const [rows] = (await scope.raw(
        `SELECT alerts.id, alerts.rule_name AS ruleName, alerts.opened_at AS openedAt, alerts.opened_detail AS detail, alerts.acknowledged_at AS acknowledgedAt,
                alerts.channel_id AS channelId, channels.label AS channelLabel, alerts.logger_id AS loggerId, loggers.name AS loggerName, loggers.timezone AS loggerTimezone
         FROM alerts FORCE INDEX (alerts_one_open_per_rule)
         LEFT JOIN channels ON channels.tenant_id = alerts.tenant_id AND channels.id = alerts.channel_id
         LEFT JOIN loggers ON loggers.tenant_id = alerts.tenant_id AND loggers.id = alerts.logger_id
         WHERE alerts.tenant_id = :lab AND alerts.open_rule_id IS NOT NULL
         ORDER BY alerts.opened_at DESC, alerts.id DESC
         LIMIT ?`,
        [limit],
      )) as [Array<Record<string, unknown>>];
      return {
        count: Number(counted?.n ?? 0),
        recent: rows.map((r) => ({
          id: Number(r.id),
          ruleName: r.ruleName as string,
          openedAt: Number(r.openedAt),
          detail: r.detail as string,
          acknowledged: r.acknowledgedAt !== null && r.acknowledgedAt !== undefined,
          channel: r.channelId === null || r.channelLabel === null ? null : { id: Number(r.channelId), label: r.channelLabel as string },
          logger:
            r.loggerId === null || r.loggerName === null
              ? null
              : { id: Number(r.loggerId), name: r.loggerName as string, timezone: r.loggerTimezone as string },
        })),
      };
    },

    /**
     * The reasons quarantined rows wait for (at most `maxReasons` of them), each with its latest
     * arrival, latest first. The reasons are found by skipping through
     * `quarantine_reason_recent_index` (tenant_id, reason_code, received_at DESC, …): each step asks
     * for the first reason after the previous one, a range dive with a bound value (a correlated
     * or GROUP BY form made MariaDB walk every row of the lab's quarantine); the latest arrival is
     * the first index entry of its reason. So 2 dives per reason, however many rows wait.
     */
    async quarantineReasons(maxReasons: number): Promise<QuarantineReasonRow[]> {
      const reasons: QuarantineReasonRow[] = [];
      let after = '';
      while (reasons.length < maxReasons) {
        const [rows] = (await scope.raw(
          `SELECT q.reason_code AS reason, q.received_at AS latestAt FROM quarantined_rows q FORCE INDEX (quarantine_reason_recent_index)
           WHERE q.tenant_id = :lab AND q.reason_code > ? ORDER BY q.reason_code, q.received_at DESC LIMIT 1`,
          [after],
        )) as [Array<{ reason: string; latestAt: Date }>];
        if (rows.length === 0) break;
        reasons.push({ reason: rows[0].reason, latestAt: rows[0].latestAt });
        after = rows[0].reason;
      }
      return reasons.sort((a, b) => b.latestAt.getTime() - a.latestAt.getTime());
    },

    /**
     * A reason's waiting rows, counted along `quarantine_reason_recent_index` up to `cap` (`atLeast`
     * when the count stopped there), so a large backlog costs at most `cap` index entries.
     */
    async quarantinedWithReason(reason: string, cap: number): Promise<{ count: number; atLeast: boolean }> {
      const [rows] = (await scope.raw(
        'SELECT COUNT(*) AS n FROM (SELECT 1 FROM quarantined_rows FORCE INDEX (quarantine_reason_recent_index) WHERE quarantined_rows.tenant_id = :lab AND quarantined_rows.reason_code = ? LIMIT ?) AS matching',
        [reason, cap],
      )) as [Array<{ n: number }>];
      const count = Number(rows[0]?.n ?? 0);
      return { count, atLeast: count >= cap };
    },

    /**
     * Loggers in use whose working (unrevoked) keys were never used by a logger, and those without
     * a working key, each oldest first and cut at `limit`, with their counts. One statement over
     * the lab's loggers (a plan limit) joined to their keys along `ingest_keys_logger_index`.
     */
    async loggerKeys(limit: number): Promise<{ neverUsed: LoggerSinceRow[]; neverUsedCount: number; withoutKey: LoggerSinceRow[]; withoutKeyCount: number }> {
      const rows = await scope
        .table('loggers')
        .leftJoin('ingest_keys', (j) =>
          j.on('ingest_keys.tenant_id', '=', 'loggers.tenant_id').andOn('ingest_keys.logger_id', '=', 'loggers.id').andOnNull('ingest_keys.revoked_at'),
        )
        .whereNull('loggers.retired_at')
        .groupBy('loggers.id', 'loggers.name', 'loggers.created_at')
        .havingRaw('MAX(ingest_keys.last_used_at) IS NULL')
        .select('loggers.id as loggerId', 'loggers.name as loggerName', 'loggers.created_at as loggerCreatedAt')
        .count({ keys: 'ingest_keys.id' })
        .min({ keySince: 'ingest_keys.created_at' })
        .orderBy('loggers.created_at');
      const neverUsed: LoggerSinceRow[] = [];
      const withoutKey: LoggerSinceRow[] = [];
      for (const r of rows as Array<Record<string, unknown>>) {
        const keyed = Number(r.keys) > 0;
        (keyed ? neverUsed : withoutKey).push({
          loggerId: Number(r.loggerId),
          loggerName: r.loggerName as string,
          since: (keyed ? r.keySince : r.loggerCreatedAt) as Date,
        });
      }
      neverUsed.sort((a, b) => a.since.getTime() - b.since.getTime());
      return {
        neverUsed: neverUsed.slice(0, limit),
        neverUsedCount: neverUsed.length,
        withoutKey: withoutKey.slice(0, limit),
        withoutKeyCount: withoutKey.length,
      };
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

    /** A logger's name and IANA zone by id (retired ones too), or null when it is not this lab's. */
    async loggerNameAndZone(loggerId: number): Promise<{ name: string; timezone: string } | null> {
      const row = await scope.table('loggers').where('loggers.id', loggerId).first('loggers.name', 'loggers.timezone');
      return row ? { name: row.name as string, timezone: row.timezone as string } : null;
    },
  };
}

export type LabOverviewRepo = ReturnType<typeof labOverviewRepo>;
