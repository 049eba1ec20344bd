import type { BackgroundJob } from '../../jobs/background-jobs.ts';
import type { IngestHooks } from '../ingest/ingest-hooks.ts';
import type { LogWriter } from '../../log-writer.ts';
import type { AlertEvaluator } from './alert-evaluator.ts';

/**
 * The ingestion hook of alerts: after a batch commits, the channels it wrote are judged a moment
 * later (batches arriving meanwhile are gathered into one run). It never blocks or fails the
 * ingestion: it only schedules, and the run's errors are logged (the scheduled job catches up).
 */
export function alertIngestNudge(deps: {
  evaluator: AlertEvaluator;
  logger: LogWriter;
  delayMs?: number;
  now?: () => number;
}): IngestHooks & { settle(): Promise<void> } {
  const delayMs = deps.delayMs ?? 250;
  const now = deps.now ?? Date.now;
  const waiting = new Map<number, Set<number>>();
  let timer: ReturnType<typeof setTimeout> | null = null;
  const flushing = new Set<Promise<void>>();

  function startFlush(): void {
    const run = flush();
    flushing.add(run);
    void run.finally(() => flushing.delete(run));
  }

  async function flush(): Promise<void> {
    timer = null;
    const batches = [...waiting.entries()];
    waiting.clear();
    for (const [tenantId, channels] of batches) {
      try {
        await deps.evaluator.evaluateChannels(tenantId, [...channels], now());
      } catch (err) {
        deps.logger.warn('alert evaluation after ingestion failed; the scheduled run will catch up', { tenantId, error: (err as Error).message });
      }
    }
  }

  return {
    afterCommit(batch) {
      try {
        if (batch.accepted === 0) return;
        const set = waiting.get(batch.target.tenantId) ?? new Set<number>();
        for (const c of batch.channels) set.add(c.channelId);
        waiting.set(batch.target.tenantId, set);
        if (!timer) {
          timer = setTimeout(startFlush, delayMs);
          timer.unref?.();
        }
      } catch (err) {
        deps.logger.warn('alert nudge failed', { error: (err as Error).message });
      }
    },

    /**
     * Runs what is still waiting at once and resolves when every run has ended (and so released
     * the evaluator's lease). A server shutting down calls it; without it a run cut off by the exit
     * would leave the lease held until it expires, and every other server's evaluation would wait.
     */
    async settle(): Promise<void> {
      if (timer) {
        clearTimeout(timer);
        startFlush();
      }
      while (flushing.size > 0) await Promise.allSettled([...flushing]);
    },
  };
}

/** Ticks that may wait for a run in progress; older ones beyond this are dropped (their cycles were long missed). */
export const PENDING_TICKS_KEPT = 3;

/**
 * The scheduled alert job: every `everyS` seconds one full evaluator run (silence, reminders,
 * queued mail, and any readings the ingestion nudge missed). A tick that comes while a run is
 * still going waits for it and then runs with its own time, so it claims its own cycle (a slow
 * run, or one that waited for the lease, no longer swallows the next cycle). `stop` waits for
 * the runs in progress.
 */
export function alertEvaluationJob(deps: {
  evaluator: Pick<AlertEvaluator, 'runOnce' | 'takeCyclesFromNudges'>;
  logger: LogWriter;
  everyS: number;
  now?: () => number;
}): BackgroundJob & { tickNow(): Promise<void> } {
  const now = deps.now ?? Date.now;
  let timer: ReturnType<typeof setInterval> | null = null;
  let running: Promise<void> | null = null;
  const pending: number[] = [];

  async function drain(): Promise<void> {
    for (let at = pending.shift(); at !== undefined; at = pending.shift()) {
      try {
        const s = await deps.evaluator.runOnce(at);
        if (s.opened || s.resolved || s.reminders || s.sent || s.failed) deps.logger.info('alert evaluation', { ...s });
      } catch (err) {
        deps.logger.warn('alert evaluation failed; next run retries', { error: (err as Error).message });
      }
    }
    running = null;
  }

  const tick = () => {
    pending.push(now());
    if (pending.length > PENDING_TICKS_KEPT) pending.shift();
    running ??= drain();
  };
  return {
    name: 'alert evaluation and notification sending',
    start() {
      // while this server keeps the schedule, its after-ingest runs may take a cycle nobody has claimed yet
      deps.evaluator.takeCyclesFromNudges(true);
      timer ??= setInterval(tick, deps.everyS * 1000);
    },
    async stop() {
      deps.evaluator.takeCyclesFromNudges(false);
      if (timer) clearInterval(timer);
      timer = null;
      pending.length = 0;
      await running;
    },
    /** Test seam: one tick now, as the timer would make it; resolves when every waiting tick has run. */
    async tickNow() {
      tick();
      await running;
    },
  };
}
