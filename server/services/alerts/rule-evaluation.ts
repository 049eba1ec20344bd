import type { Db } from '../../db/create-db.ts';
import { inLab, type DbOrTrx, type LabScope } from '../../db/tenant-scope.ts';
import { retryTransaction } from '../../db/retry-transaction.ts';
import { alertRulesRepo, type AlertRule } from '../../db/alert-rules.repo.ts';
import { alertsRepo } from '../../db/alerts.repo.ts';
import { alertReadingsRepo, type WatchedTarget } from '../../db/alert-readings.repo.ts';
import { channelReadingsRepo } from '../../db/channel-readings.repo.ts';
import type { AlertRuleParams } from '../../contract/alerts.ts';
import { excludedNotes } from '../notes/notes.service.ts';
import { leaveOutNotedCells } from '../notes/leave-out-noted-cells.ts';
import { queueAlertMail } from './alert-notifications.ts';
import { evaluateBounds } from './rules/bounds-rule.ts';
import { evaluateRate } from './rules/rate-rule.ts';
import { evaluateSilence } from './rules/silence-rule.ts';
import { evaluateUnusualReading, unusualScores, type NotJudged } from './rules/unusual-reading-rule.ts';
import type { RuleMemory, RuleReading, RuleStep, RuleTransition } from './rules/rule-step.ts';
import { blindMailDelayMs, decideRuleHealth, healthChange, sameHealth, type HealthObservation } from './rule-health.ts';
import { queueRuleHealthMail } from './rule-health-notifications.ts';

/** Readings judged per rule and transaction; a longer backlog is worked off in further chunks. */
export const READINGS_PER_CHUNK = 5000;
/** The most grid cells of history an unusual-reading rule may decompose (longer cycles judge nothing). */
const MAX_BASELINE_CELLS = 60_000;

/** Everything one rule evaluation needs besides the rule. */
export interface EvaluationContext {
  db: Db;
  tenantId: number;
  lab: { name: string; slug: string };
  publicUrl: string;
  now: number;
  /** The lab's reminder delay in minutes (a rule's own wins; 0 or none: the not-watching mail waits an hour). */
  reminderAfterMin?: number;
  /** Test seam: runs inside the rule's transaction just before it commits (throwing rolls it back). */
  beforeCommit?: (ruleId: number) => void;
  /**
   * The evaluator lease's fencing write (`HeldLease.fence`), made first in every rule transaction:
   * it throws LeaseLostError, rolling the transaction back, once another server holds the lease.
   */
  fence?: (trx: DbOrTrx) => Promise<void>;
}

/**
 * One rule transaction: the fencing write first, then `work`; rerun as a whole on a lock conflict
 * (a rule edited at the same moment, or a Galera certification failure), which is safe because
 * everything it writes, queued mail included, is in the transaction.
 */
export function ruleTransaction<T>(ctx: EvaluationContext, work: (trx: Db) => Promise<T>): Promise<T> {
  return retryTransaction(() =>
    ctx.db.transaction(async (trx) => {
      await ctx.fence?.(trx);
      return work(trx as unknown as Db);
    }),
  );
}

/** What an evaluation changed. */
export interface EvaluationCounts {
  opened: number;
  resolved: number;
}

/**
 * Writes a rule's transitions: opens and resolves alerts and queues their mail, all in the
 * caller's transaction. Returns the counts.
 */
async function applyTransitions(
  ctx: EvaluationContext,
  scope: LabScope,
  rule: AlertRule,
  target: WatchedTarget,
  transitions: RuleTransition[],
): Promise<EvaluationCounts> {
  const alerts = alertsRepo(scope);
  let current = await alerts.openForRule(rule.id);
  const counts = { opened: 0, resolved: 0 };
  for (const t of transitions) {
    const common = { lab: ctx.lab, publicUrl: ctx.publicUrl, rule, target, sequence: 0, at: t.ts, now: ctx.now, value: t.value, detail: t.detail };
    if (t.kind === 'open' && !current) {
      const id = await alerts.open({
        ruleId: rule.id,
        ruleName: rule.name,
        kind: rule.kind,
        channelId: target.channelId,
        loggerId: target.loggerId,
        at: t.ts,
        value: t.value,
        detail: t.detail,
        notifiedAt: ctx.now,
      });
      current = (await alerts.find(id))!;
      await queueAlertMail(scope, { ...common, alert: current, kind: 'opened' });
      counts.opened++;
    } else if (t.kind === 'resolve' && current) {
      await alerts.resolve(current.id, { at: t.ts, value: t.value, detail: t.detail });
      await queueAlertMail(scope, { ...common, alert: current, kind: 'resolved' });
      current = null;
      counts.resolved++;
    }
  }
  return counts;
}

/** The readings of a chunk as rule readings. */
function toReadings(cols: { ts: Float64Array; values: Float64Array }): RuleReading[] {
  return Array.from(cols.ts, (ts, i) => ({ ts, value: cols.values[i] }));
}

/** A value rule's step over new readings, and whether it could judge them (and if not, why). */
interface ValueRuleStep {
  step: RuleStep;
  notJudged: HealthObservation['notJudged'];
}

/** An unusual-reading rule's reason for not judging, in the rule-health reasons (no history at all is too little). */
function blindFrom(n: NotJudged, from: number): NonNullable<HealthObservation['notJudged']> {
  return { reason: n.reason === 'too-many-gaps' ? 'too-many-gaps' : 'too-little-history', detail: n.detail, from };
}

/** One step of a value rule over new readings (the unusual-reading rule reads its history first). */
async function stepValueRule(
  ctx: EvaluationContext,
  rule: AlertRule,
  target: WatchedTarget,
  memory: RuleMemory,
  readings: RuleReading[],
): Promise<ValueRuleStep> {
  if (rule.kind === 'bounds') return { step: evaluateBounds(rule.params as AlertRuleParams['bounds'], memory, readings, target.unit), notJudged: null };
  if (rule.kind === 'rate') return { step: evaluateRate(rule.params as AlertRuleParams['rate'], memory, readings, target.unit), notJudged: null };
  const params = rule.params as AlertRuleParams['unusual'];
  const stepMs = target.expectedIntervalS * 1000;
  const periodSteps = Math.round((params.periodH * 3_600_000) / stepMs);
  const span = periodSteps * params.historyCycles;
  const first = readings[0].ts;
  let notJudged: NotJudged;
  if (periodSteps < 2) {
    notJudged = {
      reason: 'too-little-history',
      detail: `One cycle spans fewer than two of the channel's expected intervals (${target.expectedIntervalS} seconds each): no pattern to learn.`,
    };
  } else if (span > MAX_BASELINE_CELLS) {
    notJudged = {
      reason: 'too-little-history',
      detail: `The history would hold ${span.toLocaleString('en-GB')} readings at the channel's interval; at most ${MAX_BASELINE_CELLS.toLocaleString('en-GB')} can be compared (use fewer cycles).`,
    };
  } else {
    const scope = inLab(ctx.db, ctx.tenantId);
    const from = first - span * stepMs;
    const read = await channelReadingsRepo(scope).range(target.channelId!, from, first);
    // readings under notes marked "leave out of analysis" (a cleaning, a calibration) are no baseline: 1 ms cells drop exactly [start, end)
    const noted = await excludedNotes(scope, { id: target.channelId!, loggerId: target.loggerId }, from, first);
    const history = leaveOutNotedCells(read, noted, 1).data;
    // the grid spans the whole window read, so a logger silent at either end of it leaves empty cells there (filled for the fit), not a shorter history
    const scoring = unusualScores({ ts: history.ts, values: history.values }, readings, stepMs, periodSteps, { from, to: first });
    if (scoring.scores) return { step: evaluateUnusualReading(params, scoring, memory, readings, target.unit), notJudged: null };
    notJudged = scoring.notJudged;
  }
  return { step: evaluateUnusualReading(params, null, memory, readings, target.unit), notJudged: blindFrom(notJudged, first) };
}

/**
 * Records whether a value rule is watching after a step ({@link decideRuleHealth}) and queues
 * the not-watching or watching-again mail it owes ({@link healthChange}), in the caller's
 * transaction. Writes nothing when nothing changed.
 */
async function recordHealth(
  ctx: EvaluationContext,
  scope: LabScope,
  rule: AlertRule,
  target: WatchedTarget,
  seen: Pick<HealthObservation, 'judgedUpTo' | 'notJudged'>,
): Promise<void> {
  const prev = rule.health;
  const next = decideRuleHealth(prev, {
    now: ctx.now,
    watchingSince: rule.watchingSince,
    retirement: await alertRulesRepo(scope).retirement(rule.channelId!),
    lastReadingTs: target.lastReadingTs,
    expectedIntervalS: target.expectedIntervalS,
    ...seen,
  });
  const change = healthChange(prev, next, ctx.now, blindMailDelayMs(rule.reminderAfterMin, ctx.reminderAfterMin));
  if (sameHealth(prev, change.record)) return;
  await alertRulesRepo(scope).saveHealth(rule.id, change.record);
  const blind = change.record.notWatching ?? prev.notWatching;
  if (change.mail && blind) {
    await queueRuleHealthMail(scope, {
      lab: ctx.lab,
      publicUrl: ctx.publicUrl,
      rule,
      target,
      kind: change.mail,
      episode: change.record.episode,
      blind,
      now: ctx.now,
    });
  }
}

/**
 * Judges the readings a value rule (bounds, rate, unusual) has not seen yet, oldest first, in
 * chunks of {@link READINGS_PER_CHUNK}, and records whether the rule is watching. Each chunk is
 * one (fenced) transaction that locks the rule's row, writes the alert transitions with their queued
 * mail, the rule's new memory and its health (with any not-watching or watching-again mail)
 * together, so a crash at any point loses nothing and doubles nothing: the next run starts from
 * the last committed cursor. A run with no new readings still records the health.
 */
export async function evaluateValueRule(ctx: EvaluationContext, ruleId: number): Promise<EvaluationCounts> {
  const total = { opened: 0, resolved: 0 };
  for (let chunk = 0; chunk < 100; chunk++) {
    const step = await ruleTransaction(ctx, async (trx) => {
      const scope = inLab(trx, ctx.tenantId);
      const rule = await alertRulesRepo(scope).find(ruleId, { forUpdate: true });
      if (!rule || !rule.enabled || rule.kind === 'silence' || rule.channelId === null) return null;
      const target = await alertReadingsRepo(scope).channelTarget(rule.channelId);
      if (!target) return null;
      const from = rule.cursor.cursorTs === null ? Number.MIN_SAFE_INTEGER : rule.cursor.cursorTs + 1;
      const readings = toReadings(
        await channelReadingsRepo(inLab(ctx.db, ctx.tenantId)).range(rule.channelId, from, Number.MAX_SAFE_INTEGER, READINGS_PER_CHUNK),
      );
      const seen: Pick<HealthObservation, 'judgedUpTo' | 'notJudged'> = { judgedUpTo: null, notJudged: null };
      let counts: EvaluationCounts = { opened: 0, resolved: 0 };
      if (readings.length > 0) {
        const open = (await alertsRepo(scope).openForRule(rule.id)) !== null;
        const { step, notJudged } = await stepValueRule(
          ctx,
          rule,
          target,
          { pendingSince: rule.cursor.pendingSince, previous: rule.cursor.previous, open },
          readings,
        );
        counts = await applyTransitions(ctx, scope, rule, target, step.transitions);
        await alertRulesRepo(scope).saveCursor(rule.id, {
          cursorTs: readings[readings.length - 1].ts,
          pendingSince: step.memory.pendingSince,
          previous: step.memory.previous,
        });
        if (notJudged) seen.notJudged = notJudged;
        else seen.judgedUpTo = readings[readings.length - 1].ts;
      }
      // every step, with or without new readings: a rule can go blind while nothing arrives
      await recordHealth(ctx, scope, rule, target, seen);
      ctx.beforeCommit?.(rule.id);
      return { counts, more: readings.length === READINGS_PER_CHUNK };
    });
    if (!step) break;
    // counted once committed (a rerun transaction counts its own transitions)
    total.opened += step.counts.opened;
    total.resolved += step.counts.resolved;
    if (!step.more) break;
  }
  return total;
}

/** Checks a silence rule against the clock, in one (fenced) transaction that locks the rule's row. */
export async function evaluateSilenceRule(ctx: EvaluationContext, ruleId: number): Promise<EvaluationCounts> {
  return ruleTransaction(ctx, async (trx) => {
    const scope = inLab(trx, ctx.tenantId);
    const rule = await alertRulesRepo(scope).find(ruleId, { forUpdate: true });
    if (!rule || !rule.enabled || rule.kind !== 'silence') return { opened: 0, resolved: 0 };
    const reads = alertReadingsRepo(scope);
    const target = rule.channelId !== null ? await reads.channelTarget(rule.channelId) : await reads.loggerTarget(rule.loggerId!);
    if (!target) return { opened: 0, resolved: 0 };
    const open = (await alertsRepo(scope).openForRule(rule.id)) !== null;
    const { factor } = rule.params as AlertRuleParams['silence'];
    const r = evaluateSilence({
      lastReadingTs: target.lastReadingTs,
      watchingSince: rule.watchingSince,
      expectedIntervalS: target.expectedIntervalS,
      factor,
      open,
      now: ctx.now,
    });
    const counts = r.transition ? await applyTransitions(ctx, scope, rule, target, [r.transition]) : { opened: 0, resolved: 0 };
    ctx.beforeCommit?.(rule.id);
    return counts;
  });
}

/** The watched target of a rule (for reminder mail), outside any transaction. */
export async function targetOf(scope: LabScope, rule: AlertRule): Promise<WatchedTarget | null> {
  const reads = alertReadingsRepo(scope);
  return rule.channelId !== null ? reads.channelTarget(rule.channelId) : reads.loggerTarget(rule.loggerId!);
}
