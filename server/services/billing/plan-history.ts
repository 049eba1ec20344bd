import { AppError } from '../../errors.ts';

/**
 * Where a lab's plan lets it look back to: the earliest reading time (epoch ms), the plan's days of
 * history, and whether the plan removes older readings from storage (`readingRemoval`).
 */
export interface HistoryWindow {
  earliestMs: number;
  historyDays: number;
  removesOlder?: boolean;
}

/** 402: the whole range asked for lies before what the lab's plan shows. */
export class OutsidePlanHistoryError extends AppError {
  constructor(historyDays: number, earliestMs: number, removesOlder = false) {
    super(
      402,
      'outside_plan_history',
      `This lab's plan shows the last ${historyDays} days (from ${new Date(earliestMs).toISOString()}). ` +
        (removesOlder
          ? 'This plan also removes older readings from storage after its export days; the Billing page says which and when.'
          : 'Older readings are kept, not deleted; a plan with a longer history shows them again.'),
    );
  }
}

/**
 * The plan's history rule for a time range, so the channel browser, diagnostics and exports all
 * show the same span: a range starting before the window starts at the window instead
 * (`cutAtMs` says where, for the HTTP layer to announce), a range wholly before it (ending at or
 * before the window's start) is refused with 402, and any other range passes unchanged
 * (`cutAtMs` null).
 */
export function clampToHistory<Q extends { from: number; to: number }>(window: HistoryWindow, q: Q): { range: Q; cutAtMs: number | null } {
  const { earliestMs, historyDays } = window;
  if (q.from >= earliestMs) return { range: q, cutAtMs: null };
  if (q.to <= earliestMs) throw new OutsidePlanHistoryError(historyDays, earliestMs, window.removesOlder);
  return { range: { ...q, from: earliestMs }, cutAtMs: earliestMs };
}
