/**
 * Bumps of each lab's usage counter, written one statement at a time per lab: while one write
 * is on its way, further bumps of that lab are summed and go out together in the next. Every
 * committed ingest batch bumps the counter; without this, each batch would be one more
 * autocommitted UPDATE of the same row of `lab_billing`, and all loggers of a busy lab would
 * queue on that row. A failed write is reported and dropped, as a lost bump always was: the
 * usage job recounts the exact figure from the rollups every 15 minutes.
 */
export interface UsageCounterWrites {
  /** Adds `count` readings to the lab's counter (soon, not necessarily at once). */
  add(labId: number, count: number): void;
  /** Bumps not yet known to be stored (waiting or being written): the plan-limit check adds them. */
  pending(labId: number): number;
  /** Resolves once every bump made so far is written or has failed. */
  settled(): Promise<void>;
}

export function createUsageCounterWrites(
  write: (labId: number, count: number) => Promise<void>,
  onError: (labId: number, err: unknown) => void,
): UsageCounterWrites {
  const waiting = new Map<number, number>();
  const writing = new Map<number, number>();
  const idle: Array<() => void> = [];

  function next(labId: number): void {
    if (writing.has(labId)) return;
    const count = waiting.get(labId);
    if (count === undefined) {
      if (writing.size === 0 && waiting.size === 0) idle.splice(0).forEach((resolve) => resolve());
      return;
    }
    waiting.delete(labId);
    writing.set(labId, count);
    write(labId, count)
      .catch((err: unknown) => onError(labId, err))
      .finally(() => {
        writing.delete(labId);
        next(labId);
      });
  }

  return {
    add(labId, count) {
      if (count <= 0) return;
      waiting.set(labId, (waiting.get(labId) ?? 0) + count);
      next(labId);
    },
    pending(labId) {
      return (waiting.get(labId) ?? 0) + (writing.get(labId) ?? 0);
    },
    settled() {
      if (writing.size === 0 && waiting.size === 0) return Promise.resolve();
      return new Promise((resolve) => idle.push(resolve));
    },
  };
}
