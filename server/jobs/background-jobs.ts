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

/** A job that runs on a fixed interval, as `repeatingJob` makes it, and can be asked to run at once. */
export interface RepeatingJob extends BackgroundJob {
  /** Starts a run now when the job is started in this process (during a run: one more right after it); a no-op otherwise. */
  kick(): void;
}

/**
 * A background job that runs `run` right after `start()` and then every `everyMs`, never two runs
 * at once (an interval tick during a run is skipped). A failed run is logged as a warning with `failedMessage` and the next one retries: a
 * database outage must not become an unhandled rejection, which would end the process. The timer
 * does not keep the process alive; `stop()` waits for a run in progress.
 */
export function repeatingJob(opts: { name: string; everyMs: number; run: () => Promise<unknown>; logger: LogWriter; failedMessage: string }): RepeatingJob {
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<void> | null = null;
  let again = false;
  const tick = () => {
    if (running) return;
    running = opts
      .run()
      .then(() => undefined)
      .catch((err: unknown) => opts.logger.warn(opts.failedMessage, { err: String(err) }))
      .finally(() => {
        running = null;
        if (again && timer) {
          again = false;
          tick();
        }
      });
  };
  return {
    name: opts.name,
    start() {
      tick();
      timer = setInterval(tick, opts.everyMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      timer = null;
      again = false;
      await running;
    },
    kick() {
      if (!timer) return;
      if (running) again = true;
      else tick();
    },
  };
}
