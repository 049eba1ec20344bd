import { withUnit, type RuleMemory, type RuleReading, type RuleStep, type RuleTransition } from './rule-step.ts';

/** Parameters of a rate-of-change rule. */
export interface RateParams {
  /** Largest allowed change per minute between consecutive readings (> 0). */
  maxPerMinute: number;
  /** Which changes count: rises only, falls only, or both. */
  direction: 'rise' | 'fall' | 'either';
}

/**
 * Rate-of-change rule: the change between two consecutive readings divided by the minutes
 * between them; opens at the reading whose rate exceeds `maxPerMinute` in the watched
 * direction, resolves at the first later reading whose rate is within it. The first reading a
 * rule ever sees only becomes the reference for the next. Readings must be in time order
 * (two readings with the same time are never compared). Texts give the rate to three
 * significant digits and the limit as it was set, with the unit. Pure.
 *
 * Cost: O(n) in the number of readings.
 */
export function evaluateRate(params: RateParams, memory: RuleMemory, readings: readonly RuleReading[], unit = ''): RuleStep {
  let { open, previous } = memory;
  const transitions: RuleTransition[] = [];
  for (const r of readings) {
    if (previous && r.ts > previous.ts) {
      const perMinute = (r.value - previous.value) / ((r.ts - previous.ts) / 60_000);
      const watched = params.direction === 'rise' ? perMinute : params.direction === 'fall' ? -perMinute : Math.abs(perMinute);
      const rate = `${perMinute >= 0 ? '+' : ''}${withUnit(perMinute, unit, null)} per minute`;
      if (watched > params.maxPerMinute && !open) {
        open = true;
        transitions.push({ kind: 'open', ts: r.ts, value: r.value, detail: `changed at ${rate} (limit ${withUnit(params.maxPerMinute, unit)} per minute)` });
      } else if (watched <= params.maxPerMinute && open) {
        open = false;
        transitions.push({ kind: 'resolve', ts: r.ts, value: r.value, detail: `changes at ${rate} again, within the limit` });
      }
    }
    if (!previous || r.ts > previous.ts) previous = r;
  }
  return { memory: { pendingSince: null, previous, open }, transitions };
}
