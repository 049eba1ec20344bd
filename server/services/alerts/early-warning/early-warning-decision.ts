/** What the evaluation knows about a rule when it decides its early warning. */
export interface WarningState {
  /** An expected-stage alert of the rule is open. */
  warningOpen: boolean;
  /** The rule's crossed-stage (limit) alert is open. */
  limitAlertOpen: boolean;
  /** The newest reading is already beyond a limit (the limit alert may be waiting out its hold time). */
  newestBeyond: boolean;
  /** The chance of passing a limit within the horizon, or null when no projection could be made. */
  chance: number | null;
  /** The rule's chance level (0.5–0.99). */
  level: number;
}

/** What to do with the rule's early warning. */
export type WarningDecision =
  | { kind: 'open' }
  /** Keep it open and store the latest projection. */
  | { kind: 'update' }
  | { kind: 'resolve'; why: 'fell-back' | 'crossed' | 'not-projected' }
  | { kind: 'none' };

/**
 * Hysteresis of the early warning: it opens when the chance reaches the rule's level and resolves
 * only when the chance falls below the level less this much (0.8 opens, below 0.7 resolves), so a
 * chance hovering at the level does not open and close it at every reading. Ten points is about
 * twelve Monte Carlo standard errors of the default 4,000 paths at p = 0.8, well clear of noise.
 * Our own choice; common practice for alarm deadbands.
 */
export const WARNING_HYSTERESIS = 0.1;

/**
 * Decides a bounds rule's early warning. The warning never replaces the limit alert: a real
 * crossing always opens the limit alert (the bounds rule does that on its own), and while the
 * limit alert is open the warning has done its job and resolves ("the limit alert takes over");
 * none opens beside it. A newest reading already beyond the limit opens no warning (the limit
 * alert is waiting out its hold time) but keeps an open one. Without a projection an open warning
 * resolves, saying why, rather than standing on stale grounds. Pure.
 */
export function decideEarlyWarning(s: WarningState): WarningDecision {
  if (s.limitAlertOpen) return s.warningOpen ? { kind: 'resolve', why: 'crossed' } : { kind: 'none' };
  if (s.chance === null) return s.warningOpen ? { kind: 'resolve', why: 'not-projected' } : { kind: 'none' };
  if (s.newestBeyond) return s.warningOpen ? { kind: 'update' } : { kind: 'none' };
  if (s.chance >= s.level) return s.warningOpen ? { kind: 'update' } : { kind: 'open' };
  if (s.warningOpen) return s.chance < s.level - WARNING_HYSTERESIS ? { kind: 'resolve', why: 'fell-back' } : { kind: 'update' };
  return { kind: 'none' };
}
