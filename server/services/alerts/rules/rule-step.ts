import { formatNumber, formatReading, readingDecimals } from './alert-numbers.ts';

/** One stored reading as the rules see it (epoch ms, value). */
export interface RuleReading {
  ts: number;
  value: number;
}

/**
 * What a rule remembers between evaluations (kept in MariaDB on the rule's row, so a restart
 * neither forgets a pending hold nor re-reads readings already judged).
 */
export interface RuleMemory {
  /** Time of the first reading of the current unbroken breach (for hold times), or null. */
  pendingSince: number | null;
  /** The last reading judged (rate of change compares the next one with it), or null. */
  previous: RuleReading | null;
  /** Whether the rule has an open alert. */
  open: boolean;
}

/** An alert opening or resolving, at the reading (or moment) that caused it. */
export interface RuleTransition {
  kind: 'open' | 'resolve';
  /** Epoch ms of the reading (or, for silence, of the moment) that decided it. */
  ts: number;
  /** The reading's value; null for silence. */
  value: number | null;
  /** One sentence for people: what was seen. */
  detail: string;
}

/** A rule's new memory and the transitions it produced, oldest first. */
export interface RuleStep {
  memory: RuleMemory;
  transitions: RuleTransition[];
}

/** The memory of a rule that has never seen a reading. */
export const FRESH_MEMORY: RuleMemory = Object.freeze({ pendingSince: null, previous: null, open: false });

/**
 * A number as its own resolution for alert texts: as many decimals as it carries, at most six
 * ("6", "7.5", "-0.000012"). For limits and settings a person typed.
 */
export function formatValue(v: number): string {
  return formatNumber(v, readingDecimals([v]));
}

/**
 * A value with the channel's unit for alert texts ("12.4 °C"; the number alone when the channel
 * has no unit), at `decimals` (the channel's resolution), else at the value's own.
 */
export function withUnit(v: number, unit = '', decimals: number | null = readingDecimals([v])): string {
  return formatReading(v, unit, decimals);
}

/**
 * A duration in words for alert texts, rounded to what a person reads: seconds below two
 * minutes, minutes below two hours, hours (and minutes) below two days, then days and hours.
 */
export function durationWords(ms: number): string {
  const unit = (n: number, one: string) => `${n.toLocaleString('en-GB')} ${one}${n === 1 ? '' : 's'}`;
  const s = Math.round(ms / 1000);
  if (s < 120) return unit(s, 'second');
  const min = Math.round(ms / 60_000);
  if (min < 120) return unit(min, 'minute');
  if (min < 48 * 60) return min % 60 ? `${unit(Math.floor(min / 60), 'hour')} ${unit(min % 60, 'minute')}` : unit(min / 60, 'hour');
  const h = Math.round(ms / 3_600_000);
  return h % 24 ? `${unit(Math.floor(h / 24), 'day')} ${unit(h % 24, 'hour')}` : unit(h / 24, 'day');
}
