import { AppError } from '../errors.ts';

/** Seconds a refused caller is told to wait: about one typical uncached diagnostics run. */
export const DIAGNOSTICS_RETRY_AFTER_S = 5;

/** One person already has as many diagnostics runs in flight as this process allows them. */
export class DiagnosticsBusyError extends AppError {
  override readonly retryAfterSeconds: number;

  constructor(running: readonly string[], retryAfterSeconds: number) {
    const n = running.length;
    super(
      429,
      'diagnostics_busy',
      `${n} diagnostics ${n === 1 ? 'run of yours is' : 'runs of yours are'} still running (${running.join(', ')}); try again when one finishes.`,
    );
    this.retryAfterSeconds = retryAfterSeconds;
  }
}

export interface DiagnosticsConcurrencyOptions {
  /** Runs one person may have in flight in this process at once (at least 1). */
  maxPerPerson: number;
  /** The `Retry-After` of a refusal, in seconds (default DIAGNOSTICS_RETRY_AFTER_S). */
  retryAfterS?: number;
}

/**
 * A per-person cap on diagnostics runs in flight, so one person firing many heavy runs at
 * once cannot occupy every analysis worker while others wait. `enter` takes a slot or refuses
 * with DiagnosticsBusyError (429 + Retry-After) naming what that person has running; the
 * returned function gives the slot back (calling it twice is harmless). Counts live in this
 * process's memory: with several app processes each counts on its own.
 */
export function createDiagnosticsConcurrency(options: DiagnosticsConcurrencyOptions) {
  if (!Number.isSafeInteger(options.maxPerPerson) || options.maxPerPerson < 1) {
    throw new Error(`diagnostics concurrency: maxPerPerson must be a whole number of at least 1 (got ${String(options.maxPerPerson)})`);
  }
  const retryAfterS = options.retryAfterS ?? DIAGNOSTICS_RETRY_AFTER_S;
  // Per person, the descriptions of their runs in flight (one entry object per run).
  const inFlight = new Map<number, Set<{ what: string }>>();

  return {
    maxPerPerson: options.maxPerPerson,

    /** Takes one of `personId`'s slots for a run described by `what` (e.g. "channel 'Air temperature'"). */
    enter(personId: number, what: string): () => void {
      const runs = inFlight.get(personId) ?? new Set();
      if (runs.size >= options.maxPerPerson)
        throw new DiagnosticsBusyError(
          [...runs].map((r) => r.what),
          retryAfterS,
        );
      const run = { what };
      runs.add(run);
      inFlight.set(personId, runs);
      return () => {
        runs.delete(run);
        if (runs.size === 0 && inFlight.get(personId) === runs) inFlight.delete(personId);
      };
    },

    /** How many runs `personId` has in flight now. */
    running(personId: number): number {
      return inFlight.get(personId)?.size ?? 0;
    },
  };
}

export type DiagnosticsConcurrency = ReturnType<typeof createDiagnosticsConcurrency>;
