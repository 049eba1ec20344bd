import { AnalysisInputError, type AnalysisInputDetail } from '../analysis/index.ts';
import { analysisFunctions, type AnalysisTask } from './analysis-registry.ts';
import { warmUpEngine } from './engine-warm-up.ts';

// Before the first task: piscina hands this thread work once the module has loaded.
warmUpEngine();

/** What crosses back to the pool when the engine rejects its input. */
export interface WorkerInputFailure {
  inputError: string;
  /** The error's typed reason and counts (plain data, so it survives structured cloning). */
  detail?: AnalysisInputDetail;
}

/**
 * Worker entry point (piscina calls the default export): runs one engine function by name.
 * An `AnalysisInputError` comes back as a plain `{ inputError }` value, because structured
 * cloning would strip the error's class; the pool turns it into an AnalysisInputError again.
 */
export default function runAnalysisTask(task: AnalysisTask): unknown {
  const fn = (analysisFunctions as Record<string, (...args: unknown[]) => unknown>)[task?.fn];
  if (typeof fn !== 'function') return { inputError: `unknown analysis function: ${String(task?.fn)}` };
  try {
    return { value: fn(...(task.args as unknown[])) };
  } catch (error) {
    if (error instanceof AnalysisInputError) return { inputError: error.message, detail: error.detail } satisfies WorkerInputFailure;
    throw error;
  }
}
