import type { BackgroundJob } from '../../jobs/background-jobs.ts';
import type { IngestHooks } from '../ingest/ingest-hooks.ts';
import type { LogWriter } from '../../log-writer.ts';
import type { AlertEvaluator } from './alert-evaluator.ts';

/**
 * The ingestion hook of alerts: after a batch commits, the channels it wrote are judged a moment
 * later (batches arriving meanwhile are gathered into one run). It never blocks or fails the
 * ingestion: it only schedules, and the run's errors are logged (the scheduled job catches up).
 */
export function alertIngestNudge(deps: { evaluator: AlertEvaluator; logger: LogWriter; delayMs?: number; now?: () => number }): IngestHooks {
  const delayMs = deps.delayMs ?? 250;
  const now = deps.now ?? Date.now;
  const waiting = new Map<number, Set<number>>();
  let timer: ReturnType<typeof setTimeout> | null = null;

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
          timer = setTimeout(() => void flush(), delayMs);
          timer.unref?.();
        }
      } catch (err) {
        deps.logger.warn('alert nudge failed', { error: (err as Error).message });
      }
    },
  };
}

/**
 * The scheduled alert job: every `everyS` seconds one full evaluator run (silence, reminders,
 * queued mail, and any readings the ingestion nudge missed). `stop` waits for a run in progress.
 */
export function alertEvaluationJob(deps: { evaluator: AlertEvaluator; logger: LogWriter; everyS: number; now?: () => number }): BackgroundJob {
  const now = deps.now ?? Date.now;
  let timer: ReturnType<typeof setInterval> | null = null;
  let running: Promise<void> | null = null;
  const tick = () => {
    if (running) return;
    running = deps.evaluator
      .runOnce(now())
      .then((s) => {
        if (s.opened || s.resolved || s.reminders || s.sent || s.failed) deps.logger.info('alert evaluation', { ...s });
      })
      .catch((err: Error) => deps.logger.warn('alert evaluation failed; next run retries', { error: err.message }))
      .finally(() => {
        running = null;
      });
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
      await running;
    },
  };
}
