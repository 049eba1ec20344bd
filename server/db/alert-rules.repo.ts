import type { ClockChoice } from '../contract/me.ts';
import type { LabScope } from './tenant-scope.ts';
import { newId } from './new-id.ts';
import type { AlertRuleKind, RuleBlindReason } from '../contract/alerts.ts';

/** A rule's memory between evaluations (see migrations/20261202001600_create-alert-rules.ts). */
export interface AlertRuleCursor {
  /** Newest reading time already judged, or null before the first evaluation. */
  cursorTs: number | null;
  pendingSince: number | null;
  previous: { ts: number; value: number } | null;
}

/**
 * Whether a rule is watching, as the evaluator last recorded it (see
 * migrations/20261204120000_add-alert-rule-health.ts).
 */
export interface AlertRuleHealthRecord {
  /** Time of the newest reading the rule judged; null before the first. */
  lastJudgedAt: number | null;
  /** Why and since when the rule cannot watch; null while it watches. */
  notWatching: { reason: RuleBlindReason; detail: string; since: number } | null;
  /** How many times the rule has stopped watching (the sequence of its health mails). */
  episode: number;
  /** When the not-watching mail of the current episode was queued; null before (or while watching). */
  mailedAt: number | null;
}

export interface AlertRule {
  id: number;
  name: string;
  kind: AlertRuleKind;
  channelId: number | null;
  loggerId: number | null;
  params: Record<string, unknown>;
  reminderAfterMin: number | null;
  enabled: boolean;
  createdBy: number | null;
  createdAt: Date;
  updatedAt: Date;
  /** Epoch ms the rule started watching (silence counts from here when nothing ever reported). */
  watchingSince: number;
  cursor: AlertRuleCursor;
  health: AlertRuleHealthRecord;
}

export type AlertRuleInsert = Pick<AlertRule, 'name' | 'kind' | 'channelId' | 'loggerId' | 'params' | 'reminderAfterMin' | 'enabled' | 'watchingSince'> & {
  createdBy: number;
  /** Start judging readings after this time (readings already stored when the rule was made are history). */
  cursorTs: number | null;
};

const COLUMNS = [
  'alert_rules.id',
  'alert_rules.name',
  'alert_rules.kind',
  'alert_rules.channel_id as channelId',
  'alert_rules.logger_id as loggerId',
  'alert_rules.params',
  'alert_rules.reminder_after_min as reminderAfterMin',
  'alert_rules.enabled',
  'alert_rules.created_by as createdBy',
  'alert_rules.created_at as createdAt',
  'alert_rules.updated_at as updatedAt',
  'alert_rules.watching_since as watchingSince',
  'alert_rules.cursor_ts as cursorTs',
  'alert_rules.pending_since_ts as pendingSince',
  'alert_rules.previous_ts as previousTs',
  'alert_rules.previous_value as previousValue',
  'alert_rules.last_judged_ts as lastJudgedTs',
  'alert_rules.blind_reason as blindReason',
  'alert_rules.blind_detail as blindDetail',
  'alert_rules.blind_since as blindSince',
  'alert_rules.blind_episode as blindEpisode',
  'alert_rules.blind_mailed_at as blindMailedAt',
];
const opt = (v: unknown) => (v === null || v === undefined ? null : Number(v));
const toRule = (r: Record<string, unknown>): AlertRule => ({
  id: Number(r.id),
  name: r.name as string,
  kind: r.kind as AlertRuleKind,
  channelId: opt(r.channelId),
  loggerId: opt(r.loggerId),
  params: JSON.parse(r.params as string) as Record<string, unknown>,
  reminderAfterMin: opt(r.reminderAfterMin),
  enabled: Boolean(r.enabled),
  createdBy: opt(r.createdBy),
  createdAt: r.createdAt as Date,
  updatedAt: r.updatedAt as Date,
  watchingSince: Number(r.watchingSince),
  cursor: {
    cursorTs: opt(r.cursorTs),
    pendingSince: opt(r.pendingSince),
    previous: r.previousTs === null || r.previousTs === undefined ? null : { ts: Number(r.previousTs), value: Number(r.previousValue) },
  },
  health: {
    lastJudgedAt: opt(r.lastJudgedTs),
    notWatching:
      r.blindReason === null || r.blindReason === undefined
        ? null
        : { reason: r.blindReason as RuleBlindReason, detail: (r.blindDetail as string | null) ?? '', since: Number(r.blindSince) },
    episode: Number(r.blindEpisode ?? 0),
    mailedAt: opt(r.blindMailedAt),
  },
});

/** Data access for one lab's `alert_rules` and their `alert_subscriptions`. */
export function alertRulesRepo(scope: LabScope) {
  return {
    async list(): Promise<AlertRule[]> {
      return (await scope.table('alert_rules').orderBy('alert_rules.name').select(COLUMNS)).map(toRule);
    },
    async listEnabled(): Promise<AlertRule[]> {
      return (await scope.table('alert_rules').where('alert_rules.enabled', true).select(COLUMNS)).map(toRule);
    },
    async find(id: number, opts: { forUpdate?: boolean } = {}): Promise<AlertRule | null> {
      const q = scope.table('alert_rules').where('alert_rules.id', id).first(COLUMNS);
      if (opts.forUpdate) q.forUpdate();
      const row = await q;
      return row ? toRule(row) : null;
    },
    /** Enabled rules watching any of `channelIds` (value rules; the ingest nudge uses it). */
    async enabledForChannels(channelIds: number[]): Promise<AlertRule[]> {
      if (channelIds.length === 0) return [];
      return (await scope.table('alert_rules').where('alert_rules.enabled', true).whereIn('alert_rules.channel_id', channelIds).select(COLUMNS)).map(toRule);
    },
    async insert(input: AlertRuleInsert): Promise<number> {
      const id = newId();
      await scope.insert('alert_rules', {
        id,
        name: input.name,
        kind: input.kind,
        channel_id: input.channelId,
        logger_id: input.loggerId,
        params: JSON.stringify(input.params),
        reminder_after_min: input.reminderAfterMin,
        enabled: input.enabled,
        created_by: input.createdBy,
        watching_since: input.watchingSince,
        cursor_ts: input.cursorTs,
      });
      return id;
    },
    async update(
      id: number,
      change: { name?: string; params?: Record<string, unknown>; reminderAfterMin?: number | null; enabled?: boolean },
      at: Date,
    ): Promise<void> {
      const cols: Record<string, unknown> = { updated_at: at };
      if (change.name !== undefined) cols.name = change.name;
      if (change.params !== undefined) cols.params = JSON.stringify(change.params);
      if (change.reminderAfterMin !== undefined) cols.reminder_after_min = change.reminderAfterMin;
      if (change.enabled !== undefined) cols.enabled = change.enabled;
      await scope.table('alert_rules').where('alert_rules.id', id).update(cols);
    },
    /** Stores a rule's memory after an evaluation (in the same transaction as its alerts). */
    async saveCursor(id: number, cursor: AlertRuleCursor): Promise<void> {
      await scope
        .table('alert_rules')
        .where('alert_rules.id', id)
        .update({
          cursor_ts: cursor.cursorTs,
          pending_since_ts: cursor.pendingSince,
          previous_ts: cursor.previous?.ts ?? null,
          previous_value: cursor.previous?.value ?? null,
        });
    },
    /** Stores whether a rule is watching (in the same transaction as its evaluation and any health mail). */
    async saveHealth(id: number, health: AlertRuleHealthRecord): Promise<void> {
      await scope
        .table('alert_rules')
        .where('alert_rules.id', id)
        .update({
          last_judged_ts: health.lastJudgedAt,
          blind_reason: health.notWatching?.reason ?? null,
          blind_detail: health.notWatching?.detail.slice(0, 500) ?? null,
          blind_since: health.notWatching?.since ?? null,
          blind_episode: health.episode,
          blind_mailed_at: health.mailedAt,
        });
    },
    /**
     * Whether the watched channel, or its logger, is retired, and since when (epoch ms; the
     * earlier of the two); null while both are in service. A rule on a retired channel cannot watch it.
     */
    async retirement(channelId: number): Promise<{ what: 'channel' | 'logger'; at: number } | null> {
      const r = await scope
        .table('channels')
        .join('loggers', function joinLogger() {
          this.on('loggers.tenant_id', 'channels.tenant_id').andOn('loggers.id', 'channels.logger_id');
        })
        .where('channels.id', channelId)
        .first('channels.retired_at as channelRetiredAt', 'loggers.retired_at as loggerRetiredAt');
      const at = (d: unknown) => (d instanceof Date ? d.getTime() : d === null || d === undefined ? null : new Date(d as string).getTime());
      const channel = at(r?.channelRetiredAt);
      const logger = at(r?.loggerRetiredAt);
      if (channel === null && logger === null) return null;
      if (logger !== null && (channel === null || logger < channel)) return { what: 'logger', at: logger };
      return { what: 'channel', at: channel! };
    },
    /** Forgets a pending hold and the reference reading (after the limits change or the rule is re-enabled). */
    async resetMemory(id: number): Promise<void> {
      await scope.table('alert_rules').where('alert_rules.id', id).update({ pending_since_ts: null, previous_ts: null, previous_value: null });
    },
    /** Starts watching afresh (re-enabled): readings up to `cursorTs` count as history, the memory is cleared. */
    async restart(id: number, cursorTs: number | null, watchingSince: number): Promise<void> {
      await scope
        .table('alert_rules')
        .where('alert_rules.id', id)
        .update({ cursor_ts: cursorTs, watching_since: watchingSince, pending_since_ts: null, previous_ts: null, previous_value: null });
    },
    async remove(id: number): Promise<void> {
      await scope.table('alert_subscriptions').where('alert_subscriptions.rule_id', id).delete();
      await scope.table('alert_rules').where('alert_rules.id', id).delete();
    },
    async subscribe(ruleId: number, userId: number): Promise<void> {
      await scope.insert('alert_subscriptions', { rule_id: ruleId, user_id: userId }).onConflict(['tenant_id', 'rule_id', 'user_id']).ignore();
    },
    async unsubscribe(ruleId: number, userId: number): Promise<void> {
      await scope.table('alert_subscriptions').where({ 'alert_subscriptions.rule_id': ruleId, 'alert_subscriptions.user_id': userId }).delete();
    },
    /** Rule ids the user is subscribed to. */
    async subscribedRuleIds(userId: number): Promise<Set<number>> {
      const rows = await scope.table('alert_subscriptions').where('alert_subscriptions.user_id', userId).select('alert_subscriptions.rule_id as ruleId');
      return new Set(rows.map((r: { ruleId: unknown }) => Number(r.ruleId)));
    },
    /**
     * Subscribers of a rule who are still members of the lab, with their address and own time
     * zone: mail goes only to people who may still see the lab.
     */
    async recipients(ruleId: number): Promise<Array<{ userId: number; email: string; displayName: string; timeZone: string | null; clock: ClockChoice }>> {
      const rows = await scope
        .table('alert_subscriptions')
        .join('memberships', function joinMembership() {
          this.on('memberships.tenant_id', 'alert_subscriptions.tenant_id').andOn('memberships.user_id', 'alert_subscriptions.user_id');
        })
        .join('users', 'users.id', 'alert_subscriptions.user_id')
        .where('alert_subscriptions.rule_id', ruleId)
        .orderBy('alert_subscriptions.user_id')
        .select('users.id as userId', 'users.email', 'users.display_name as displayName', 'users.time_zone as timeZone', 'users.clock as clock');
      return rows.map((r: Record<string, unknown>) => ({
        userId: Number(r.userId),
        email: r.email as string,
        displayName: r.displayName as string,
        timeZone: (r.timeZone as string | null) ?? null,
        clock: (r.clock as ClockChoice | null) ?? 'logger',
      }));
    },
  };
}

export type AlertRulesRepo = ReturnType<typeof alertRulesRepo>;
