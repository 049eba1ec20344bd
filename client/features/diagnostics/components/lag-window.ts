import { fmtSeconds } from './format-number.ts';

/** Units a lag window is typed in. */
export type LagUnit = 'min' | 'h' | 'd';

export const LAG_UNIT_SECONDS: Record<LagUnit, number> = { min: 60, h: 3600, d: 86_400 };

/** The server's bounds on a cross-correlation lag window, in steps (the diagnostics schema's `ccfMaxLag`). */
const MAX_STEPS = 10_000;

/**
 * A lag window typed in time units as whole steps of `stepS` seconds (rounded to the nearest
 * step): undefined when left empty (the server's default), or a `field: reason` message when it
 * is not a positive number or falls outside 1…10000 steps.
 */
export function lagWindowSteps(amount: string, unit: LagUnit, stepS: number): number | undefined | string {
  const text = amount.trim();
  if (text === '') return undefined;
  const value = Number(text);
  if (!/^\d+(\.\d+)?$/.test(text) || !(value > 0)) return 'Lag window: a positive number';
  const steps = Math.round((value * LAG_UNIT_SECONDS[unit]) / stepS);
  if (steps < 1 || steps > MAX_STEPS) return `Lag window: from ${fmtSeconds(stepS)} to ${fmtSeconds(MAX_STEPS * stepS)} at steps of ${fmtSeconds(stepS)}`;
  return steps;
}

/** A signed lag as time on the axis: "0", "+10 min", "−1 h 30 min". */
export function lagTimeLabel(lag: number, stepMs: number): string {
  if (lag === 0) return '0';
  return `${lag > 0 ? '+' : '−'}${fmtSeconds((Math.abs(lag) * stepMs) / 1000)}`;
}
