import type { Db } from '../../db/create-db.ts';
import { inLab, type LabScope } from '../../db/tenant-scope.ts';
import { alertRulesRepo, type AlertRule } from '../../db/alert-rules.repo.ts';
import { alertsRepo } from '../../db/alerts.repo.ts';
import { alertReadingsRepo } from '../../db/alert-readings.repo.ts';
import { channelsRepo } from '../../db/channels.repo.ts';
import { loggersRepo } from '../../db/loggers.repo.ts';
import { auditRepo } from '../../db/audit.repo.ts';
import { NotFoundError } from '../../errors.ts';
import { PARAMS_SCHEMAS, type CreateAlertRuleInput, type UpdateAlertRuleInput } from '../../contract/alerts.ts';
import type { Actor, LabContext } from '../lab-context.ts';
import { InvalidAlertRuleError, parseRuleInput } from './alert-errors.ts';
import { ALERT_RULE_LABELS } from '../../contract/words/alerts.ts';
import { problemsMessage } from '../../contract/words/fields.ts';

/** A rule as people see it: with what it watches, whether the viewer is subscribed and whether it is firing. */
export interface AlertRuleView extends Omit<AlertRule, 'cursor'> {
  watched: { channelId: number | null; loggerId: number; label: string; loggerName: string; unit: string };
  subscribed: boolean;
  openAlertId: number | null;
}

/** A rule that cannot work on what it watches (422), its field named as the rule form names it. */
function ruleCannotWork(field: string, label: string, reason: string): InvalidAlertRuleError {
  return new InvalidAlertRuleError(problemsMessage([{ label, reason }]), [{ field, label, reason }]);
}

const NO_RULE = 'No such alert rule in this lab.';

/** The unusual-reading rule needs 2 … 20,000 readings per cycle at the channel's expected interval. */
function checkUnusualFits(periodH: number, historyCycles: number, intervalS: number): void {
  const steps = Math.round((periodH * 3600) / intervalS);
  if (steps < 2)
    throw ruleCannotWork('params.periodH', ALERT_RULE_LABELS.periodH, `must span at least two expected intervals of the channel (${intervalS} seconds each)`);
  if (steps * historyCycles > 60_000) {
    throw ruleCannotWork(
      'params.historyCycles',
      ALERT_RULE_LABELS.historyCycles,
      `${historyCycles} cycles of ${periodH} hours hold ${(steps * historyCycles).toLocaleString('en-GB')} readings at the channel's interval of ${intervalS} seconds; at most 60,000 (use fewer cycles)`,
    );
  }
}

/**
 * Alert rules (make, change, delete, subscribe) and alerts (list, history per channel,
 * acknowledge). Changes are audited; a channel or logger of another lab answers 404 as if it
 * did not exist.
 */
export function createAlertRulesService(deps: { db: Db; now?: () => number }) {
  const now = deps.now ?? Date.now;

  async function find(scope: LabScope, ruleId: number, forUpdate = false): Promise<AlertRule> {
    const rule = await alertRulesRepo(scope).find(ruleId, { forUpdate });
    if (!rule) throw new NotFoundError(NO_RULE);
    return rule;
  }

  async function views(scope: LabScope, rules: AlertRule[], viewerId: number): Promise<AlertRuleView[]> {
    const subscribed = await alertRulesRepo(scope).subscribedRuleIds(viewerId);
    const open = new Map((await alertsRepo(scope).openAlerts()).map((a) => [a.ruleId, a.id]));
    const reads = alertReadingsRepo(scope);
    const out: AlertRuleView[] = [];
    for (const { cursor: _cursor, ...rule } of rules) {
      const t = rule.channelId !== null ? await reads.channelTarget(rule.channelId) : await reads.loggerTarget(rule.loggerId!);
      out.push({
        ...rule,
        watched: t
          ? { channelId: t.channelId, loggerId: t.loggerId, label: t.label, loggerName: t.loggerName, unit: t.unit }
          : { channelId: rule.channelId, loggerId: rule.loggerId ?? 0, label: '(gone)', loggerName: '', unit: '' },
        subscribed: subscribed.has(rule.id),
        openAlertId: open.get(rule.id) ?? null,
      });
    }
    return out;
  }

  return {
    /** Every rule of the lab, with whether the viewer is subscribed. */
    async list(lab: LabContext, viewer: Pick<Actor, 'id'>): Promise<AlertRuleView[]> {
      const scope = inLab(deps.db, lab.id);
      return views(scope, await alertRulesRepo(scope).list(), viewer.id);
    },

    /** Makes a rule on a channel (or, for silence, a logger) of this lab; its maker is subscribed. */
    async create(lab: LabContext, actor: Actor, input: CreateAlertRuleInput): Promise<AlertRuleView> {
      const id = await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        let cursorTs: number | null = null;
        if (input.channelId !== undefined) {
          const channel = await channelsRepo(scope).find(input.channelId);
          if (!channel || channel.retiredAt) throw new NotFoundError('No such channel in this lab.');
          const target = (await alertReadingsRepo(scope).channelTarget(input.channelId))!;
          cursorTs = target.lastReadingTs;
          if (input.kind === 'unusual') checkUnusualFits(input.params.periodH, input.params.historyCycles, target.expectedIntervalS);
        } else {
          const logger = 'loggerId' in input && input.loggerId !== undefined ? await loggersRepo(scope).find(input.loggerId) : null;
          if (!logger || logger.retiredAt) throw new NotFoundError('No such logger in this lab.');
        }
        const ruleId = await alertRulesRepo(scope).insert({
          name: input.name,
          kind: input.kind,
          channelId: input.channelId ?? null,
          loggerId: 'loggerId' in input ? (input.loggerId ?? null) : null,
          params: input.params,
          reminderAfterMin: input.reminderAfterMin,
          enabled: input.enabled,
          createdBy: actor.id,
          watchingSince: now(),
          cursorTs,
        });
        await alertRulesRepo(scope).subscribe(ruleId, actor.id);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'alert-rule.created',
          targetType: 'alert-rule',
          targetId: ruleId,
          summary: `${actor.displayName} made the ${input.kind} alert rule "${input.name}"`,
          details: { kind: input.kind, params: input.params },
        });
        return ruleId;
      });
      const scope = inLab(deps.db, lab.id);
      return (await views(scope, [await find(scope, id)], actor.id))[0];
    },

    /** Changes name, parameters, reminder delay or enabled; disabling closes an open alert without mail. */
    async update(lab: LabContext, actor: Actor, ruleId: number, input: UpdateAlertRuleInput): Promise<AlertRuleView> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const rule = await find(scope, ruleId, true);
        const params = input.params === undefined ? undefined : (parseRuleInput(PARAMS_SCHEMAS[rule.kind], input.params, 'params') as Record<string, unknown>);
        if (params && rule.kind === 'unusual' && rule.channelId !== null) {
          const t = await alertReadingsRepo(scope).channelTarget(rule.channelId);
          if (t) checkUnusualFits(Number(params.periodH), Number(params.historyCycles), t.expectedIntervalS);
        }
        const repo = alertRulesRepo(scope);
        await repo.update(ruleId, { name: input.name, params, reminderAfterMin: input.reminderAfterMin, enabled: input.enabled }, new Date(now()));
        if (params) await repo.resetMemory(ruleId);
        if (input.enabled === false && rule.enabled) await alertsRepo(scope).closeForDeletedRule(ruleId, now());
        if (input.enabled === true && !rule.enabled) {
          const t = rule.channelId !== null ? await alertReadingsRepo(scope).channelTarget(rule.channelId) : null;
          await repo.restart(ruleId, t?.lastReadingTs ?? null, now());
        }
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'alert-rule.updated',
          targetType: 'alert-rule',
          targetId: ruleId,
          summary: `${actor.displayName} changed the alert rule "${input.name ?? rule.name}"`,
          details: { ...input },
        });
      });
      const scope = inLab(deps.db, lab.id);
      return (await views(scope, [await find(scope, ruleId)], actor.id))[0];
    },

    /** Deletes a rule and its subscriptions; its open alert is closed without mail, its history stays. */
    async remove(lab: LabContext, actor: Actor, ruleId: number): Promise<void> {
      await deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const rule = await find(scope, ruleId, true);
        await alertsRepo(scope).closeForDeletedRule(ruleId, now());
        await alertRulesRepo(scope).remove(ruleId);
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'alert-rule.deleted',
          targetType: 'alert-rule',
          targetId: ruleId,
          summary: `${actor.displayName} deleted the alert rule "${rule.name}"`,
        });
      });
    },

    /** Subscribes (or unsubscribes) the acting person to a rule's mail. */
    async setSubscribed(lab: LabContext, actor: Pick<Actor, 'id'>, ruleId: number, on: boolean): Promise<void> {
      const scope = inLab(deps.db, lab.id);
      await find(scope, ruleId);
      if (on) await alertRulesRepo(scope).subscribe(ruleId, actor.id);
      else await alertRulesRepo(scope).unsubscribe(ruleId, actor.id);
    },

    /** Open alerts, or all opened in the last `days` days plus any still open (newest first, at most 500). */
    async alerts(lab: LabContext, q: { status: 'open' | 'all'; days: number; channelId?: number }) {
      return alertsRepo(inLab(deps.db, lab.id)).list({ openOnly: q.status === 'open', since: now() - q.days * 86_400_000, channelId: q.channelId, limit: 500 });
    },

    /** A channel's alerts overlapping [from, to), for the bands on its chart. */
    async channelAlerts(lab: LabContext, channelId: number, from: number, to: number) {
      const scope = inLab(deps.db, lab.id);
      if (!(await channelsRepo(scope).find(channelId))) throw new NotFoundError('No such channel in this lab.');
      return alertsRepo(scope).overlapping(channelId, from, to);
    },

    /** Acknowledges an alert with a note (someone is on it): no more reminders; the resolution is still mailed. */
    async acknowledge(lab: LabContext, actor: Actor, alertId: number, note: string) {
      return deps.db.transaction(async (trx) => {
        const scope = inLab(trx, lab.id);
        const alert = await alertsRepo(scope).find(alertId);
        if (!alert) throw new NotFoundError('No such alert in this lab.');
        await alertsRepo(scope).acknowledge(alertId, actor.id, note, new Date(now()));
        await auditRepo(scope).record({
          actorUserId: actor.id,
          action: 'alert.acknowledged',
          targetType: 'alert',
          targetId: alertId,
          summary: `${actor.displayName} acknowledged the alert of "${alert.ruleName}"${note ? `: ${note}` : ''}`,
        });
        return (await alertsRepo(scope).find(alertId))!;
      });
    },
  };
}

export type AlertRulesService = ReturnType<typeof createAlertRulesService>;
