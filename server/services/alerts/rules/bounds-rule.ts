import { readingDecimals } from './alert-numbers.ts';
import { durationWords, withUnit, type RuleMemory, type RuleReading, type RuleStep, type RuleTransition } from './rule-step.ts';

/** Limits of a bounds rule; at least one of low and high is set (low < high when both are). */
export interface BoundsParams {
  low: number | null;
  high: number | null;
  /** How long (s) the readings must stay outside before the alert opens; 0 opens at once. */
  holdS: number;
}

/**
 * Bounds rule: opens when the readings stay below `low` or above `high` for at least the hold
 * time (measured between reading timestamps: the first reading outside starts the hold, the
 * alert opens at the first reading outside that is `holdS` or more later), so a single noisy
 * reading pages nobody; resolves at the first reading back inside the limits (a reading
 * inside also restarts a pending hold). Readings must be in time order. Texts give readings at
 * the resolution the readings carry and limits as they were set, with the unit. Pure: it reads
 * no clock and changes none of its inputs.
 *
 * Cost: O(n) in the number of readings.
 */
export function evaluateBounds(params: BoundsParams, memory: RuleMemory, readings: readonly RuleReading[], unit = ''): RuleStep {
  const holdMs = params.holdS * 1000;
  let { pendingSince, open } = memory;
  let previous = memory.previous;
  const transitions: RuleTransition[] = [];
  const decimals = readingDecimals(readings.map((r) => r.value));
  for (const r of readings) {
    const below = params.low !== null && r.value < params.low;
    const above = params.high !== null && r.value > params.high;
    if (below || above) {
      pendingSince ??= r.ts;
      if (!open && r.ts - pendingSince >= holdMs) {
        open = true;
        const limit = below ? `below the low limit ${withUnit(params.low!, unit)}` : `above the high limit ${withUnit(params.high!, unit)}`;
        const held = holdMs > 0 ? ` for ${durationWords(r.ts - pendingSince)}` : '';
        transitions.push({ kind: 'open', ts: r.ts, value: r.value, detail: `${withUnit(r.value, unit, decimals)} is ${limit}${held}` });
      }
    } else {
      pendingSince = null;
      if (open) {
        open = false;
        transitions.push({ kind: 'resolve', ts: r.ts, value: r.value, detail: `${withUnit(r.value, unit, decimals)} is back within the limits` });
      }
    }
    previous = r;
  }
  return { memory: { pendingSince, previous, open }, transitions };
}
