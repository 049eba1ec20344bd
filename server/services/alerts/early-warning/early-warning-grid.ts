/** The projection's grid for a rule: its step, the history it reads and the horizon in steps. */
export interface WarningGrid {
  stepMs: number;
  horizonSteps: number;
  historyMs: number;
}

/** At most this many steps to the horizon: a finer step adds simulation cost, not foresight. */
export const MAX_HORIZON_STEPS = 120;
/** History read for the projection: three days (three daily cycles, the fewest the cycle search and STL take) … */
export const HISTORY_MS = 3 * 86_400_000;
/** … but at most this many grid cells. */
export const MAX_HISTORY_CELLS = 4320;

/**
 * The grid of a rule's projection: the channel's expected interval, coarsened (to whole seconds)
 * until the horizon is at most {@link MAX_HORIZON_STEPS} steps; three days of history, capped at
 * {@link MAX_HISTORY_CELLS} cells (a channel read every few seconds then looks back less than a
 * day and no daily cycle is taken off). Pure.
 */
export function warningGrid(expectedIntervalS: number, horizonMin: number): WarningGrid {
  const horizonMs = horizonMin * 60_000;
  const stepMs = Math.max(Math.max(1, expectedIntervalS) * 1000, Math.ceil(horizonMs / MAX_HORIZON_STEPS / 1000) * 1000);
  return {
    stepMs,
    horizonSteps: Math.max(1, Math.round(horizonMs / stepMs)),
    historyMs: Math.min(HISTORY_MS, MAX_HISTORY_CELLS * stepMs),
  };
}
