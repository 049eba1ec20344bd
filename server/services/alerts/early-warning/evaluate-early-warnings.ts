import type { AlertRuleParams } from '../../../contract/alerts.ts';
import { alertRulesRepo, type AlertRule } from '../../../db/alert-rules.repo.ts';
import { alertReadingsRepo, type WatchedTarget } from '../../../db/alert-readings.repo.ts';
import { alertsRepo, type AlertRecord } from '../../../db/alerts.repo.ts';
import { inLab, type LabScope } from '../../../db/tenant-scope.ts';
import { queueAlertMail } from '../alert-notifications.ts';
import { ruleTransaction, type EvaluationContext } from '../rule-evaluation.ts';
import { decideEarlyWarning } from './early-warning-decision.ts';
import { warningOpenedText, warningResolvedText, type WarningEnd } from './early-warning-texts.ts';
import { projectForRule, type NotProjected, type RuleProjection } from './project-for-rule.ts';

/** What one pass over a lab's early warnings did. */
export interface EarlyWarningCounts {
  opened: number;
  resolved: number;
  /** Open warnings whose projection was refreshed. */
  updated: number;
  /** Rules with the warning on that could not be projected this time, and why (the rule-health work may record them). */
  notProjected: ({ ruleId: number } & NotProjected)[];
}

/** Whether a value is beyond one of a bounds rule's limits. */
function beyond(params: AlertRuleParams['bounds'], value: number | null): boolean {
  if (value === null) return false;
  return (params.high !== null && value > params.high) || (params.low !== null && value < params.low);
}

/** Resolves an open warning with its sentence and queues the mail, in the caller's transaction. */
async function resolveWarning(ctx: EvaluationContext, scope: LabScope, rule: AlertRule, target: WatchedTarget, warning: AlertRecord, end: WarningEnd) {
  const detail = warningResolvedText(end, target.unit);
  await alertsRepo(scope).resolve(warning.id, { at: ctx.now, value: null, detail });
  await queueAlertMail(scope, {
    lab: ctx.lab,
    publicUrl: ctx.publicUrl,
    rule,
    target,
    alert: warning,
    kind: 'resolved',
    sequence: 0,
    at: ctx.now,
    now: ctx.now,
    value: null,
    detail,
  });
}

/**
 * One rule's early warning: projects its channel (outside any transaction: reading and fitting
 * take a while and lock nothing), then, in one transaction that locks the rule's row, decides
 * ({@link decideEarlyWarning}) and opens, refreshes or resolves its expected-stage alert with the
 * mail queued beside it, so the alert and its mail commit together (a fenced transaction,
 * {@link ruleTransaction}).
 */
async function evaluateRuleWarning(ctx: EvaluationContext, ruleId: number, counts: EarlyWarningCounts): Promise<void> {
  const readScope = inLab(ctx.db, ctx.tenantId);
  const seen = await alertRulesRepo(readScope).find(ruleId);
  if (!seen || seen.kind !== 'bounds' || seen.channelId === null) return;
  const seenParams = seen.params as AlertRuleParams['bounds'];
  const seenTarget = await alertReadingsRepo(readScope).channelTarget(seen.channelId);
  if (!seenTarget) return;
  let projected: RuleProjection | null = null;
  if (seen.enabled && seenParams.earlyWarning) {
    projected = await projectForRule(
      readScope,
      {
        channelId: seen.channelId,
        expectedIntervalS: seenTarget.expectedIntervalS,
        lastReadingTs: seenTarget.lastReadingTs,
        low: seenParams.low,
        high: seenParams.high,
        earlyWarning: seenParams.earlyWarning,
        unit: seenTarget.unit,
      },
      ctx.now,
    );
    if (projected.notProjected !== null) counts.notProjected.push({ ruleId, ...projected.notProjected });
  }
  const changed = await ruleTransaction(ctx, async (trx): Promise<Omit<EarlyWarningCounts, 'notProjected'>> => {
    const done = { opened: 0, resolved: 0, updated: 0 };
    const scope = inLab(trx, ctx.tenantId);
    const rule = await alertRulesRepo(scope).find(ruleId, { forUpdate: true });
    if (!rule || rule.kind !== 'bounds' || rule.channelId === null) return done;
    const params = rule.params as AlertRuleParams['bounds'];
    const alerts = alertsRepo(scope);
    const warning = await alerts.openWarningForRule(rule.id);
    const target = (await alertReadingsRepo(scope).channelTarget(rule.channelId)) ?? seenTarget;
    // the rule changed since it was projected (warning switched off, limits moved): no stale projection is acted on
    const sameRule = rule.enabled && params.earlyWarning !== null && JSON.stringify(params) === JSON.stringify(seenParams);
    if (!sameRule || projected === null) {
      if (warning && (!rule.enabled || params.earlyWarning === null)) {
        await resolveWarning(ctx, scope, rule, target, warning, { why: 'rule-changed' });
        done.resolved++;
      }
      return done;
    }
    const decision = decideEarlyWarning({
      warningOpen: warning !== null,
      limitAlertOpen: (await alerts.openForRule(rule.id)) !== null,
      newestBeyond: beyond(params, projected.newestValue),
      chance: projected.projection?.chance ?? null,
      level: params.earlyWarning!.chance,
    });
    const watched = `${target.loggerName} · ${target.label}`;
    if (decision.kind === 'open' && projected.projection) {
      const detail = warningOpenedText(watched, projected.projection, target.unit);
      const id = await alerts.open({
        ruleId: rule.id,
        ruleName: rule.name,
        kind: rule.kind,
        channelId: target.channelId,
        loggerId: target.loggerId,
        at: projected.projection.from,
        value: projected.newestValue,
        detail,
        notifiedAt: ctx.now,
        stage: 'expected',
        projection: projected.projection,
      });
      const opened = (await alerts.find(id))!;
      await queueAlertMail(scope, {
        lab: ctx.lab,
        publicUrl: ctx.publicUrl,
        rule,
        target,
        alert: opened,
        kind: 'opened',
        sequence: 0,
        at: opened.openedAt,
        now: ctx.now,
        value: projected.newestValue,
        detail,
      });
      done.opened++;
    } else if (decision.kind === 'update' && warning && projected.projection) {
      if (await alerts.updateProjection(warning.id, projected.projection)) done.updated++;
    } else if (decision.kind === 'resolve' && warning) {
      const end: WarningEnd =
        decision.why === 'fell-back' && projected.projection
          ? { why: 'fell-back', projection: projected.projection }
          : decision.why === 'crossed'
            ? { why: 'crossed' }
            : { why: 'not-projected', detail: projected.notProjected?.detail ?? 'no projection' };
      await resolveWarning(ctx, scope, rule, target, warning, end);
      done.resolved++;
    }
    ctx.beforeCommit?.(rule.id);
    return done;
  });
  // counted once committed (a transaction rerun on a lock conflict counts its own changes)
  counts.opened += changed.opened;
  counts.resolved += changed.resolved;
  counts.updated += changed.updated;
}

/**
 * The early warnings of one lab (issue #22): for every bounds rule with `earlyWarning` set (or
 * only those on `channelIds`, after ingestion), projects its channel once and opens, refreshes or
 * resolves its expected-stage alert; an open warning of a rule that was disabled or had its
 * warning switched off resolves. Call it after the value rules of the same evaluation, so a limit
 * alert opened by this evaluation's readings is seen and the warning hands over to it.
 */
export async function evaluateEarlyWarnings(ctx: EvaluationContext, channelIds?: number[]): Promise<EarlyWarningCounts> {
  const scope = inLab(ctx.db, ctx.tenantId);
  const rules = alertRulesRepo(scope);
  const candidates = channelIds ? await rules.enabledForChannels(channelIds) : await rules.list();
  const counts: EarlyWarningCounts = { opened: 0, resolved: 0, updated: 0, notProjected: [] };
  const openWarnings = new Set((await alertsRepo(scope).openWarnings()).map((a) => a.ruleId));
  for (const rule of candidates) {
    if (rule.kind !== 'bounds') continue;
    const on = rule.enabled && (rule.params as AlertRuleParams['bounds']).earlyWarning != null;
    if (!on && !openWarnings.has(rule.id)) continue;
    await evaluateRuleWarning(ctx, rule.id, counts);
  }
  return counts;
}
