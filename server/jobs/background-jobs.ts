import type { LogWriter } from '../log-writer.ts';

/** Work the server does on a schedule (reconciling usage, evaluating alerts, sending queued mail). */
export interface BackgroundJob {
  /** A short name for logs. */
  name: string;
  /** Starts the job's timers; must return at once. */
  start(): void;
  /** Stops the timers and waits for a run in progress to finish. */
  stop(): Promise<void>;
}

/**
 * Starts every job and returns the function that stops them all. The entry point calls it
 * after the server listens; tests leave jobs stopped and drive them directly with a simulated
 * clock, so no timer ever runs in the background of a test.
 */
export function startBackgroundJobs(jobs: readonly BackgroundJob[], logger: LogWriter): () => Promise<void> {
  for (const job of jobs) {
    job.start();
    logger.info('background job started', { job: job.name });
  }
  return async () => {
    await Promise.allSettled(jobs.map((job) => job.stop()));
  };
}
