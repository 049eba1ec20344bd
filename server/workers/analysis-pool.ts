import { extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import { AnalysisInputError, type AnalysisInputDetail } from '../analysis/index.ts';
import type { AnalysisResult, AnalysisTask } from './analysis-registry.ts';

export interface AnalysisPoolOptions {
  /** Worker threads (default: piscina's, from the number of CPUs). */
  maxThreads?: number;
  /** Threads kept alive while idle (default 0 with maxThreads ≤ 1, else piscina's). */
  minThreads?: number;
}

export interface AnalysisPool {
  /**
   * Runs one engine function on a worker thread; rejects with AnalysisInputError on bad input.
   * With `signal`, aborting it cancels the task (a queued task never starts, a running one's
   * thread is stopped) and the promise rejects with piscina's AbortError.
   */
  run<T extends AnalysisTask>(task: T, options?: { signal?: AbortSignal }): Promise<AnalysisResult<T>>;
  /** Lets running tasks finish, then stops the threads. */
  close(): Promise<void>;
}

/**
 * Worker file next to this one: `analysis.worker.ts` when running from source (tsx, vitest),
 * `analysis.worker.js` from the tsc build. Workers do not inherit tsx's loader, so the source
 * form gets `--import tsx`.
 */
function workerLocation(): { filename: string; execArgv: string[] } {
  const ext = extname(fileURLToPath(import.meta.url));
  const filename = fileURLToPath(new URL(`./analysis.worker${ext}`, import.meta.url));
  return { filename, execArgv: ext === '.ts' ? ['--import', 'tsx'] : [] };
}

/**
 * A pool of worker threads for heavy engine calls (ACF of a year of readings, period search),
 * so the API's event loop keeps answering other requests meanwhile (piscina 5).
 */
export function createAnalysisPool(options: AnalysisPoolOptions = {}): AnalysisPool {
  const { filename, execArgv } = workerLocation();
  const pool = new Piscina({
    filename,
    execArgv,
    ...(options.maxThreads !== undefined ? { maxThreads: options.maxThreads } : {}),
    ...(options.minThreads !== undefined
      ? { minThreads: options.minThreads }
      : options.maxThreads !== undefined
        ? { minThreads: Math.min(1, options.maxThreads) }
        : {}),
  });
  return {
    async run<T extends AnalysisTask>(task: T, runOptions: { signal?: AbortSignal } = {}): Promise<AnalysisResult<T>> {
      const outcome = (await pool.run(task, runOptions.signal ? { signal: runOptions.signal } : {})) as {
        value?: unknown;
        inputError?: string;
        detail?: AnalysisInputDetail;
      };
      if (outcome.inputError !== undefined) throw new AnalysisInputError(outcome.inputError, outcome.detail);
      return outcome.value as AnalysisResult<T>;
    },
    close: () => pool.close(),
  };
}
