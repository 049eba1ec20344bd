import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { repeatingJob } from './background-jobs.ts';
import type { LogWriter } from '../log-writer.ts';

/** A run the test finishes by hand, so it can act while the run is in progress. */
function controlledRuns() {
  const pending: Array<{ resolve: () => void; reject: (e: Error) => void }> = [];
  let started = 0;
  const run = () =>
    new Promise<void>((resolve, reject) => {
      started++;
      pending.push({ resolve, reject });
    });
  return { run, started: () => started, finish: () => pending.shift()!.resolve(), fail: (e: Error) => pending.shift()!.reject(e) };
}

const flush = async () => {
  for (let i = 0; i < 5; i++) await Promise.resolve();
};

describe('repeatingJob', () => {
  const warnings: string[] = [];
  const logger: LogWriter = { info: () => {}, warn: (msg) => warnings.push(msg), error: () => {} };
  beforeEach(() => {
    vi.useFakeTimers();
    warnings.length = 0;
  });
  afterEach(() => vi.useRealTimers());

  it('runs at start and on each interval, skipping a tick that finds a run in progress', async () => {
    const runs = controlledRuns();
    const job = repeatingJob({ name: 'test', everyMs: 1000, run: runs.run, logger, failedMessage: 'failed' });
    job.start();
    expect(runs.started()).toBe(1);
    vi.advanceTimersByTime(1000); // the first run is still going: skipped
    expect(runs.started()).toBe(1);
    runs.finish();
    await flush();
    vi.advanceTimersByTime(1000);
    expect(runs.started()).toBe(2);
    runs.finish();
    await flush();
    await job.stop();
    vi.advanceTimersByTime(5000);
    expect(runs.started()).toBe(2);
  });

  it('logs a failed run with its message and runs again at the next interval', async () => {
    const runs = controlledRuns();
    const job = repeatingJob({ name: 'test', everyMs: 1000, run: runs.run, logger, failedMessage: 'the test job failed; the next run retries' });
    job.start();
    runs.fail(new Error('database gone'));
    await flush();
    expect(warnings).toEqual(['the test job failed; the next run retries']);
    vi.advanceTimersByTime(1000);
    expect(runs.started()).toBe(2);
    runs.finish();
    await flush();
    await job.stop();
  });

  it('kick runs at once when idle, queues exactly one more run when busy, and does nothing before start', async () => {
    const runs = controlledRuns();
    const job = repeatingJob({ name: 'test', everyMs: 60_000, run: runs.run, logger, failedMessage: 'failed' });
    job.kick();
    expect(runs.started()).toBe(0);
    job.start();
    job.kick();
    job.kick();
    expect(runs.started()).toBe(1);
    runs.finish();
    await flush();
    expect(runs.started()).toBe(2); // the queued one
    runs.finish();
    await flush();
    expect(runs.started()).toBe(2);
    job.kick();
    expect(runs.started()).toBe(3);
    runs.finish();
    await flush();
    await job.stop();
  });

  it('stop waits for the run in progress', async () => {
    const runs = controlledRuns();
    const job = repeatingJob({ name: 'test', everyMs: 1000, run: runs.run, logger, failedMessage: 'failed' });
    job.start();
    let stopped = false;
    const stopping = job.stop().then(() => {
      stopped = true;
    });
    await flush();
    expect(stopped).toBe(false);
    runs.finish();
    await stopping;
    expect(stopped).toBe(true);
  });
});
