import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { alertRulesRepo } from '../../db/alert-rules.repo.ts';
import { alertsRepo } from '../../db/alerts.repo.ts';
import { labsRepo } from '../../db/labs.repo.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { queueAlertMail } from './alert-notifications.ts';
import { withEvaluatorLock } from './evaluator-lock.ts';
import { sendDueMail } from './outbox-sender.ts';
import { evaluateEarlyWarnings } from './early-warning/evaluate-early-warnings.ts';
import { evaluateSilenceRule, evaluateValueRule, targetOf, type EvaluationContext } from './rule-evaluation.ts';

/** What one run did (tests and logs read it). */
export interface EvaluationSummary {
  /** False when another evaluator held the lock for longer than the wait. */
  ran: boolean;
  opened: number;
  resolved: number;
  reminders: number;
  sent: number;
  failed: number;
  /** Labs whose evaluation stopped on an error (logged; the next run starts again from the last commit). */
  errors: number;
}

export interface AlertEvaluatorDeps {
  db: Db;
  mailer: Mailer;
  logger: LogWriter;
  publicUrl: string;
  /** Minutes before a reminder when a rule sets none (0: none). */
  reminderAfterMin: number;
  /** Seconds to wait for another evaluator's run to end (default 10). */
  lockWaitS?: number;
  /** Test seam: runs inside each rule's transaction just before it commits. */
  beforeRuleCommit?: (ruleId: number) => void;
}

const EMPTY = { opened: 0, resolved: 0, reminders: 0, sent: 0, failed: 0, errors: 0 };

/**
 * The alert evaluator: judges new readings against value rules, the clock against silence
 * rules, sends reminders for alerts still open, and mails what the outbox holds. One evaluator
 * runs at a time across every app process (MariaDB named lock, {@link withEvaluatorLock});
 * every alert change commits together with its rule's memory and its queued mail, so a run
 * stopped anywhere is finished by the next without loss or double mail.
 */
export function createAlertEvaluator(deps: AlertEvaluatorDeps) {
  const waitS = deps.lockWaitS ?? 10;

  async function context(tenantId: number, now: number): Promise<EvaluationContext | null> {
    const lab = await labsRepo(deps.db).findById(tenantId);
    return lab
      ? { db: deps.db, tenantId, lab, publicUrl: deps.publicUrl, now, reminderAfterMin: deps.reminderAfterMin, beforeCommit: deps.beforeRuleCommit }
      : null;
  }

  /** Queues reminders for a lab's open, unacknowledged alerts whose delay has passed since their last mail. */
  async function remind(ctx: EvaluationContext): Promise<number> {
    const scope = inLab(deps.db, ctx.tenantId);
    const rules = new Map((await alertRulesRepo(scope).list()).map((r) => [r.id, r]));
    let count = 0;
    for (const alert of await alertsRepo(scope).openAlerts()) {
      const rule = rules.get(alert.ruleId);
      const delayMin = rule?.reminderAfterMin ?? deps.reminderAfterMin;
      if (!rule || !rule.enabled || alert.acknowledgedAt || delayMin <= 0 || ctx.now - alert.lastNotifiedAt < delayMin * 60_000) continue;
      const target = await targetOf(scope, rule);
      if (!target) continue;
      await deps.db.transaction(async (trx) => {
        const trxScope = inLab(trx, ctx.tenantId);
        if (!(await alertsRepo(trxScope).countReminder(alert.id, alert.remindersSent, ctx.now))) return;
        const value = target.channelId === null ? null : alert.openedValue;
        await queueAlertMail(trxScope, {
          lab: ctx.lab,
          publicUrl: ctx.publicUrl,
          rule,
          target,
          alert,
          kind: 'reminder',
          sequence: alert.remindersSent + 1,
          at: ctx.now,
          now: ctx.now,
          value,
          detail: `still open; when it opened: ${alert.openedDetail}`,
        });
        count++;
      });
    }
    return count;
  }

  /** Evaluates one lab: every enabled rule (or only value rules on `channelIds`), reminders, mail. */
  async function evaluateLab(tenantId: number, now: number, channelIds?: number[]) {
    const ctx = await context(tenantId, now);
    if (!ctx) return EMPTY;
    const totals = { ...EMPTY };
    const scope = inLab(deps.db, tenantId);
    const rules = channelIds ? await alertRulesRepo(scope).enabledForChannels(channelIds) : await alertRulesRepo(scope).listEnabled();
    for (const rule of rules) {
      if (rule.kind === 'silence' && channelIds) continue;
      const c = rule.kind === 'silence' ? await evaluateSilenceRule(ctx, rule.id) : await evaluateValueRule(ctx, rule.id);
      totals.opened += c.opened;
      totals.resolved += c.resolved;
    }
    // After the value rules: a limit alert opened in this run takes over from its early warning.
    const warnings = await evaluateEarlyWarnings(ctx, channelIds);
    totals.opened += warnings.opened;
    totals.resolved += warnings.resolved;
    if (!channelIds) totals.reminders = await remind(ctx);
    const mail = await sendDueMail(deps, tenantId, now);
    totals.sent = mail.sent;
    totals.failed = mail.failed;
    return totals;
  }

  const add = (a: typeof EMPTY, b: typeof EMPTY) => ({
    opened: a.opened + b.opened,
    resolved: a.resolved + b.resolved,
    reminders: a.reminders + b.reminders,
    sent: a.sent + b.sent,
    failed: a.failed + b.failed,
    errors: a.errors + b.errors,
  });

  /** One lab's evaluation; an error stops only that lab (logged), so one broken lab never silences the others. */
  async function evaluateLabSafely(tenantId: number, now: number, channelIds?: number[]) {
    try {
      return await evaluateLab(tenantId, now, channelIds);
    } catch (err) {
      deps.logger.warn('alert evaluation of a lab stopped; the next run continues from its last commit', { tenantId, error: (err as Error).message });
      return { ...EMPTY, errors: 1 };
    }
  }

  return {
    /** One full run at `now` (epoch ms) over every lab: the scheduled job and tests call it. */
    async runOnce(now: number): Promise<EvaluationSummary> {
      const r = await withEvaluatorLock(deps.db, waitS, async () => {
        let totals = { ...EMPTY };
        for (const tenantId of await crossLabRepo(deps.db).labsWithAlertWork()) totals = add(totals, await evaluateLabSafely(tenantId, now));
        return totals;
      });
      return r.ran ? { ran: true, ...r.result } : { ran: false, ...EMPTY };
    },

    /** Judges the value rules of some channels of one lab right away and sends its mail (after ingestion). */
    async evaluateChannels(tenantId: number, channelIds: number[], now: number): Promise<EvaluationSummary> {
      const r = await withEvaluatorLock(deps.db, waitS, () => evaluateLabSafely(tenantId, now, channelIds));
      return r.ran ? { ran: true, ...r.result } : { ran: false, ...EMPTY };
    },
  };
}

export type AlertEvaluator = ReturnType<typeof createAlertEvaluator>;
