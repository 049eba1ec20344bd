import type { Db } from '../../db/create-db.ts';
import { inLab } from '../../db/tenant-scope.ts';
import { alertRulesRepo } from '../../db/alert-rules.repo.ts';
import { alertsRepo } from '../../db/alerts.repo.ts';
import { labsRepo } from '../../db/labs.repo.ts';
import { crossLabRepo } from '../../db/cross-lab.repo.ts';
import type { Mailer } from '../../integrations/mail/create-mailer.ts';
import type { LogWriter } from '../../log-writer.ts';
import { createLeaseRunner, LeaseLostError, processHolderName, type HeldLease, type LeaseWait } from '../../jobs/job-lease.ts';
import { cycleStart, jobCycles } from '../../jobs/job-cycles.ts';
import { queueAlertMail } from './alert-notifications.ts';
import { sendDueMail } from './outbox-sender.ts';
import { evaluateEarlyWarnings } from './early-warning/evaluate-early-warnings.ts';
import { evaluateSilenceRule, evaluateValueRule, ruleTransaction, targetOf, type EvaluationContext } from './rule-evaluation.ts';

/** The job lease under which every evaluation runs, one holder at a time across all app servers. */
export const EVALUATOR_LEASE = 'alert-evaluator';

/**
 * How long the evaluator's lease holds without renewal. Every rule transaction renews it (its
 * fencing write), and so does the start of each lab, so it only has to outlast the longest single
 * step (one rule's chunk of 5,000 readings with an unusual-reading decomposition: seconds, not
 * a minute). A server that dies holding it delays the others by at most this long (two cycles at
 * the default 30 s interval).
 */
export const EVALUATOR_LEASE_TTL_MS = 60_000;

/** What one run did (tests and logs read it). */
export interface EvaluationSummary {
  /** False when it did not run: see `skipped`. */
  ran: boolean;
  /**
   * Why it did not run (absent when it ran): `busy`, another evaluator held the lease for longer
   * than the wait; `cycle-done`, this scheduled cycle already ran (on this or another server);
   * `lease-lost`, the lease passed to another server mid-run, so this one stopped writing.
   */
  skipped?: 'busy' | 'cycle-done' | 'lease-lost';
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
  /**
   * Length of a scheduled cycle in milliseconds (the evaluation interval, which the app always
   * passes): `runOnce(now)` claims the cycle `now` falls in, once across all servers. Without it
   * every `runOnce` runs (still under the lease) and claims nothing: tests that drive runs one by
   * one on simulated days shared between tests.
   */
  cycleMs?: number;
  /** Names this process in the lease (default: host, pid and a random part). */
  holder?: string;
  /** The lease's clock in epoch ms (default Date.now; tests pass a simulated one). */
  clock?: () => number;
  /** How waiting for the lease pauses (tests pass a recorder for `sleep`). */
  leaseWait?: Pick<LeaseWait, 'pollMs' | 'random' | 'sleep'>;
  /** Test seam: runs inside each rule's transaction just before it commits. */
  beforeRuleCommit?: (ruleId: number) => void;
}

const EMPTY = { opened: 0, resolved: 0, reminders: 0, sent: 0, failed: 0, errors: 0 };

/**
 * The alert evaluator: judges new readings against value rules, the clock against silence
 * rules, sends reminders for alerts still open, and mails what the outbox holds. Every alert
 * change commits together with its rule's memory and its queued mail, so a run stopped anywhere
 * is finished by the next without loss or double mail.
 *
 * One evaluator runs at a time across every app server: each run holds the job lease
 * {@link EVALUATOR_LEASE} (`job-lease.ts`, an ordinary row, so it holds across a Galera cluster,
 * where named locks would not), waiting for it up to `lockWaitS` with short jittered pauses. Every
 * transaction of the run begins with the lease's fencing write, so a server that lost the lease
 * (it stalled past the TTL and another took over) cannot commit anything after the takeover.
 * A scheduled run (`runOnce`) also claims its cycle in `job_runs`, in a fenced transaction, so a
 * cycle runs at most once however many servers tick in it; it records when the cycle finished and
 * prunes cycles older than seven days (`job-cycles.ts`).
 */
export function createAlertEvaluator(deps: AlertEvaluatorDeps) {
  const waitS = deps.lockWaitS ?? 10;
  const { cycleMs } = deps;
  if (cycleMs !== undefined && (!Number.isInteger(cycleMs) || cycleMs < 1))
    throw new Error('createAlertEvaluator: cycleMs must be a whole number of milliseconds from 1');
  const clock = deps.clock ?? Date.now;
  const leases = createLeaseRunner({ db: deps.db, holder: deps.holder ?? processHolderName(), now: () => new Date(clock()) });
  let queue: Promise<unknown> = Promise.resolve();
  const cycles = jobCycles(deps.db);

  /**
   * Runs `work` under the evaluator's lease. Across servers the lease decides who runs; within this
   * process the runs (the schedule and the ingestion nudges) take turns in a queue, because they
   * share one holder name. Sharing it means a lease this process could not release (the database
   * was failing over at that moment) is taken straight back by its next run instead of blocking
   * every server until it expires.
   */
  function underLease<T>(work: (lease: HeldLease) => Promise<T>) {
    const turn = queue.then(() => leases.run(EVALUATOR_LEASE, EVALUATOR_LEASE_TTL_MS, work, { ...deps.leaseWait, waitMs: waitS * 1000 }));
    queue = turn.catch(() => undefined);
    return turn;
  }

  async function context(tenantId: number, now: number, lease: HeldLease): Promise<EvaluationContext | null> {
    const lab = await labsRepo(deps.db).findById(tenantId);
    return lab
      ? {
          db: deps.db,
          tenantId,
          lab,
          publicUrl: deps.publicUrl,
          now,
          reminderAfterMin: deps.reminderAfterMin,
          beforeCommit: deps.beforeRuleCommit,
          fence: (trx) => lease.fence(trx),
        }
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
      const queued = await ruleTransaction(ctx, async (trx) => {
        const trxScope = inLab(trx, ctx.tenantId);
        if (!(await alertsRepo(trxScope).countReminder(alert.id, alert.remindersSent, ctx.now))) return false;
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
        return true;
      });
      if (queued) count++;
    }
    return count;
  }

  /** Evaluates one lab: every enabled rule (or only value rules on `channelIds`), reminders, mail. */
  async function evaluateLab(tenantId: number, now: number, lease: HeldLease, channelIds?: number[]) {
    await lease.renew();
    const ctx = await context(tenantId, now, lease);
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
    // no mail from a server that lost the lease meanwhile (each message is claimed on its own row as well)
    await lease.renew();
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

  /**
   * One lab's evaluation; an error stops only that lab (logged), so one broken lab never silences
   * the others. A lost lease stops the whole run (rethrown).
   */
  async function evaluateLabSafely(tenantId: number, now: number, lease: HeldLease, channelIds?: number[]) {
    try {
      return await evaluateLab(tenantId, now, lease, channelIds);
    } catch (err) {
      if (err instanceof LeaseLostError) throw err;
      deps.logger.warn('alert evaluation of a lab stopped; the next run continues from its last commit', { tenantId, error: (err as Error).message });
      return { ...EMPTY, errors: 1 };
    }
  }

  /** The summary of a run that did not run (or stopped) for `why`. */
  const notRun = (why: NonNullable<EvaluationSummary['skipped']>): EvaluationSummary => ({ ran: false, skipped: why, ...EMPTY });

  /** Runs `work` under the lease and turns "busy" and "lease lost" into summaries. */
  async function guarded(work: (lease: HeldLease) => Promise<EvaluationSummary>): Promise<EvaluationSummary> {
    try {
      const r = await underLease(work);
      return r.ran ? r.value : notRun('busy');
    } catch (err) {
      if (!(err instanceof LeaseLostError)) throw err;
      deps.logger.warn('alert evaluation stopped: another server took over the evaluator lease', { fencing: err.fencing });
      return notRun('lease-lost');
    }
  }

  /** The cycle start this process last saw claimed (by itself or another server): no need to ask again within it. */
  let knownClaimed: number | null = null;
  /** Whether after-ingest runs take a due cycle: only on a server that runs the scheduled job (see `takeCyclesFromNudges`). */
  let nudgesTakeCycles = false;

  /**
   * The scheduled cycle's work, if the cycle `now` falls in is still unclaimed: claims it, runs
   * every lab, records the finish. Null when the cycle was claimed already (or there are no
   * cycles). Every run under the lease asks first, the ingestion nudges included: under steady
   * ingestion the nudges of all servers hold the lease nearly all the time, and a scheduled run
   * waiting for its turn would start late and leave cycles unclaimed; this way whichever run
   * holds the lease first in a cycle does the cycle (seen in the cluster fault test).
   */
  async function cycleIfDue(lease: HeldLease, now: number): Promise<EvaluationSummary | null> {
    if (cycleMs === undefined) return null;
    const periodStart = cycleStart(now, cycleMs);
    if (periodStart.getTime() === knownClaimed) return null;
    const claimed = await cycles.claim(lease, periodStart, new Date(clock()));
    knownClaimed = periodStart.getTime();
    if (!claimed) return null;
    const totals = await everyLab(lease, now);
    await cycles.finish(lease, periodStart, new Date(clock()));
    await cycles.prune(EVALUATOR_LEASE, now);
    return totals;
  }

  /** A full run over every lab with alert work. */
  async function everyLab(lease: HeldLease, now: number): Promise<EvaluationSummary> {
    let totals = { ...EMPTY };
    for (const tenantId of await crossLabRepo(deps.db).labsWithAlertWork()) totals = add(totals, await evaluateLabSafely(tenantId, now, lease));
    return { ran: true, ...totals };
  }

  return {
    /**
     * One scheduled run at `now` (epoch ms) over every lab: claims the cycle `now` falls in
     * (with `cycleMs`), or skips when it already ran; the scheduled job and tests call it.
     */
    async runOnce(now: number): Promise<EvaluationSummary> {
      return guarded(async (lease) => {
        if (cycleMs === undefined) return everyLab(lease, now);
        return (await cycleIfDue(lease, now)) ?? notRun('cycle-done');
      });
    },

    /**
     * Judges the value rules of some channels of one lab right away and sends its mail (after
     * ingestion). When the current cycle is still unclaimed, and this server runs the schedule, it
     * does the whole cycle instead (which judges these channels too).
     */
    async evaluateChannels(tenantId: number, channelIds: number[], now: number): Promise<EvaluationSummary> {
      return guarded(
        async (lease) =>
          (nudgesTakeCycles ? await cycleIfDue(lease, now) : null) ?? { ran: true, ...(await evaluateLabSafely(tenantId, now, lease, channelIds)) },
      );
    },

    /**
     * Lets after-ingest runs take a due cycle (on) or not (off, the default). The scheduled job
     * turns it on while it runs: a server without the schedule (tests, tools) never runs a whole
     * cycle because a batch arrived.
     */
    takeCyclesFromNudges(on: boolean): void {
      nudgesTakeCycles = on;
    },
  };
}

export type AlertEvaluator = ReturnType<typeof createAlertEvaluator>;
