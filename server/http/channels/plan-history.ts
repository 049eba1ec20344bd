import type { Response } from 'express';
import { AppError } from '../../errors.ts';

/** Where a lab's plan lets it look back to (billing's `historyWindowFor`). */
export type HistoryWindow = (lab: { id: number }) => Promise<{ earliestMs: number; historyDays: number }>;

/** 402: the whole range asked for lies before what the lab's plan shows. */
export class OutsidePlanHistoryError extends AppError {
  constructor(historyDays: number, earliestMs: number) {
    super(
      402,
      'outside_plan_history',
      `This lab's plan shows the last ${historyDays} days (from ${new Date(earliestMs).toISOString()}). ` +
        'Older readings are kept, not deleted; a plan with a longer history shows them again.',
    );
  }
}

/**
 * Clamps a range's start to the plan's history window, so the channel browser, diagnostics and
 * exports all show the same span, and says so in the `Lagbook-History-Starts` header (ISO 8601)
 * whenever the range was cut. A range wholly before the window is refused with 402.
 */
export async function withinPlanHistory<Q extends { from: number; to: number }>(window: HistoryWindow | undefined, lab: { id: number }, q: Q, res: Response): Promise<Q> {
  if (!window) return q;
  const { earliestMs, historyDays } = await window(lab);
  if (q.from >= earliestMs) return q;
  if (q.to <= earliestMs) throw new OutsidePlanHistoryError(historyDays, earliestMs);
  res.set('Lagbook-History-Starts', new Date(earliestMs).toISOString());
  return { ...q, from: earliestMs };
}
