import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';
import type { AlertProjection, AlertRuleKind, AlertStage, ProjectedStep } from '../contract/alerts.ts';

export type { ProjectedStep };

/** What an expected-stage alert stores: the projection as the API shows it (unit and projected path included). */
export type StoredProjection = AlertProjection;

export interface AlertRecord {
  id: number;
  ruleId: number;
  ruleName: string;
  kind: AlertRuleKind;
  /** 'crossed' (a limit or pattern was passed) or 'expected' (a bounds rule's early warning). */
  stage: AlertStage;
  /** The latest projection of an expected-stage alert; null for crossed-stage alerts. */
  projection: StoredProjection | null;
  channelId: number | null;
  loggerId: number | null;
  openedAt: number;
  openedValue: number | null;
  openedDetail: string;
  resolvedAt: number | null;
  resolvedValue: number | null;
  resolvedDetail: string | null;
  remindersSent: number;
  lastNotifiedAt: number;
  acknowledgedAt: Date | null;
  acknowledgedBy: { name: string; email: string } | null;
  acknowledgementNote: string | null;
}

const COLUMNS = [
  'alerts.id',
  'alerts.rule_id as ruleId',
  'alerts.rule_name as ruleName',
  'alerts.kind',
  'alerts.stage',
  'alerts.projection',
  'alerts.channel_id as channelId',
  'alerts.logger_id as loggerId',
  'alerts.opened_at as openedAt',
  'alerts.opened_value as openedValue',
  'alerts.opened_detail as openedDetail',
  'alerts.resolved_at as resolvedAt',
  'alerts.resolved_value as resolvedValue',
  'alerts.resolved_detail as resolvedDetail',
  'alerts.reminders_sent as remindersSent',
  'alerts.last_notified_at as lastNotifiedAt',
  'alerts.acknowledged_at as acknowledgedAt',
  'alerts.acknowledgement_note as acknowledgementNote',
  'ack_user.display_name as ackName',
  'ack_user.email as ackEmail',
];
const opt = (v: unknown) => (v === null || v === undefined ? null : Number(v));
/** The stored projection, or null when there is none (or it cannot be read: shown as no projection). */
function readProjection(v: unknown): StoredProjection | null {
  if (typeof v !== 'string' || v === '') return null;
  try {
    const p = JSON.parse(v) as StoredProjection;
    return p && typeof p === 'object' && typeof p.model === 'string'
      ? { ...p, unit: typeof p.unit === 'string' ? p.unit : '', path: Array.isArray(p.path) ? p.path : [] }
      : null;
  } catch {
    return null;
  }
}
const toAlert = (r: Record<string, unknown>): AlertRecord => ({
  id: Number(r.id),
  ruleId: Number(r.ruleId),
  ruleName: r.ruleName as string,
  kind: r.kind as AlertRuleKind,
  stage: r.stage === 'expected' ? 'expected' : 'crossed',
  projection: readProjection(r.projection),
  channelId: opt(r.channelId),
  loggerId: opt(r.loggerId),
  openedAt: Number(r.openedAt),
  openedValue: opt(r.openedValue),
  openedDetail: r.openedDetail as string,
  resolvedAt: opt(r.resolvedAt),
  resolvedValue: opt(r.resolvedValue),
  resolvedDetail: (r.resolvedDetail as string | null) ?? null,
  remindersSent: Number(r.remindersSent),
  lastNotifiedAt: Number(r.lastNotifiedAt),
  acknowledgedAt: (r.acknowledgedAt as Date | null) ?? null,
  acknowledgedBy: r.ackEmail ? { name: r.ackName as string, email: r.ackEmail as string } : null,
  acknowledgementNote: (r.acknowledgementNote as string | null) ?? null,
});

/** Data access for one lab's `alerts`. */
export function alertsRepo(scope: LabScope) {
  const base = () => scope.table('alerts').leftJoin('users as ack_user', 'ack_user.id', 'alerts.acknowledged_by').select(COLUMNS);
  return {
    async find(id: number): Promise<AlertRecord | null> {
      const row = await base().where('alerts.id', id).first();
      return row ? toAlert(row) : null;
    },
    /** The rule's open crossed-stage alert, if any (an early warning open beside it is not it). */
    async openForRule(ruleId: number): Promise<AlertRecord | null> {
      const row = await base().where('alerts.open_rule_id', ruleId).first();
      return row ? toAlert(row) : null;
    },
    /** The rule's open expected-stage alert (its early warning), if any. */
    async openWarningForRule(ruleId: number): Promise<AlertRecord | null> {
      const row = await base().where('alerts.open_warning_rule_id', ruleId).first();
      return row ? toAlert(row) : null;
    },
    /** Open alerts of both stages, and (unless `openOnly`) those opened since `since`; newest first, at most `limit`. */
    async list(filter: { openOnly: boolean; since: number; channelId?: number; limit: number }): Promise<AlertRecord[]> {
      const q = base().orderBy('alerts.opened_at', 'desc').limit(filter.limit);
      if (filter.openOnly) q.where((w) => w.whereNotNull('alerts.open_rule_id').orWhereNotNull('alerts.open_warning_rule_id'));
      else q.where((w) => w.whereNotNull('alerts.open_rule_id').orWhereNotNull('alerts.open_warning_rule_id').orWhere('alerts.opened_at', '>=', filter.since));
      if (filter.channelId !== undefined) q.where('alerts.channel_id', filter.channelId);
      return (await q).map(toAlert);
    },
    /** A channel's alerts that overlap [from, to) (still-open ones count as lasting until now). */
    async overlapping(channelId: number, from: number, to: number): Promise<AlertRecord[]> {
      const rows = await base()
        .where('alerts.channel_id', channelId)
        .where('alerts.opened_at', '<', to)
        .where((w) => w.whereNull('alerts.resolved_at').orWhere('alerts.resolved_at', '>=', from))
        .orderBy('alerts.opened_at')
        .limit(1000);
      return rows.map(toAlert);
    },
    /**
     * Every crossed-stage alert still open in the lab (reminders and each rule's open alert read
     * these; early warnings resolve themselves and get no reminders — see {@link openWarnings}).
     */
    async openAlerts(): Promise<AlertRecord[]> {
      return (await base().whereNotNull('alerts.open_rule_id')).map(toAlert);
    },
    /** Every expected-stage alert (early warning) still open in the lab. */
    async openWarnings(): Promise<AlertRecord[]> {
      return (await base().whereNotNull('alerts.open_warning_rule_id')).map(toAlert);
    },
    /** Opens an alert; `notifiedAt` (the evaluation's clock) is when its first mail was queued, reminders count from it. */
    async open(input: {
      ruleId: number;
      ruleName: string;
      kind: AlertRuleKind;
      channelId: number | null;
      loggerId: number | null;
      at: number;
      value: number | null;
      detail: string;
      notifiedAt: number;
      /** Default 'crossed'; an 'expected' alert carries its projection and is open beside any crossed one. */
      stage?: AlertStage;
      projection?: StoredProjection | null;
    }): Promise<number> {
      const id = newId();
      const expected = input.stage === 'expected';
      await scope.insert('alerts', {
        id,
        rule_id: input.ruleId,
        open_rule_id: expected ? null : input.ruleId,
        open_warning_rule_id: expected ? input.ruleId : null,
        stage: expected ? 'expected' : 'crossed',
        projection: input.projection ? JSON.stringify(input.projection) : null,
        rule_name: input.ruleName,
        kind: input.kind,
        channel_id: input.channelId,
        logger_id: input.loggerId,
        opened_at: input.at,
        opened_value: input.value,
        opened_detail: input.detail.slice(0, 255),
        last_notified_at: input.notifiedAt,
      });
      return id;
    },
    /** Resolves an open alert of either stage; false when it was not open. */
    async resolve(id: number, input: { at: number; value: number | null; detail: string }): Promise<boolean> {
      const n = await scope
        .table('alerts')
        .where('alerts.id', id)
        .where((w) => w.whereNotNull('alerts.open_rule_id').orWhereNotNull('alerts.open_warning_rule_id'))
        .update({
          open_rule_id: null,
          open_warning_rule_id: null,
          resolved_at: input.at,
          resolved_value: input.value,
          resolved_detail: input.detail.slice(0, 255),
        });
      return n === 1;
    },
    /** Replaces an open early warning's projection with the latest one (the chart draws the present course). */
    async updateProjection(id: number, projection: StoredProjection): Promise<boolean> {
      const n = await scope
        .table('alerts')
        .where('alerts.id', id)
        .whereNotNull('alerts.open_warning_rule_id')
        .update({ projection: JSON.stringify(projection) });
      return n === 1;
    },
    /** Counts one more reminder, only if nobody else counted it first (compare-and-set on the count). */
    async countReminder(id: number, expectedSent: number, at: number): Promise<boolean> {
      const n = await scope
        .table('alerts')
        .where({ 'alerts.id': id, 'alerts.reminders_sent': expectedSent })
        .whereNotNull('alerts.open_rule_id')
        .update({ reminders_sent: expectedSent + 1, last_notified_at: at });
      return n === 1;
    },
    async acknowledge(id: number, by: number, note: string, at: Date): Promise<void> {
      await scope
        .table('alerts')
        .where('alerts.id', id)
        .update({ acknowledged_at: at, acknowledged_by: by, acknowledgement_note: note || null });
    },
    /** Closes a deleted (or disabled) rule's open alerts of both stages without mail (their history stays). */
    async closeForDeletedRule(ruleId: number, at: number): Promise<void> {
      await scope
        .table('alerts')
        .where((w) => w.where('alerts.open_rule_id', ruleId).orWhere('alerts.open_warning_rule_id', ruleId))
        .update({ open_rule_id: null, open_warning_rule_id: null, resolved_at: at, resolved_detail: 'the rule was deleted' });
    },
  };
}

export type AlertsRepo = ReturnType<typeof alertsRepo>;
