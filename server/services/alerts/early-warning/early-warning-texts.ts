import type { StoredProjection } from '../../../db/alerts.repo.ts';
import { durationWords, formatValue } from '../rules/rule-step.ts';

/** A number with the channel's unit ("8 °C"; the number alone when the channel has none). */
function valueText(v: string, unit: string): string {
  return unit.trim() ? `${v} ${unit.trim()}` : v;
}

/**
 * Decimals for the ends of a band: enough that a band as wide as `width` shows about two
 * significant digits of its width (a band 6.93–8.41 reads "6.9–8.4"), at most 6. Common practice
 * for quoting an interval no more precisely than its own width.
 */
export function bandDecimals(width: number): number {
  if (!(width > 0) || !Number.isFinite(width)) return 2;
  return Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(width))));
}

/** The chance for people: two decimals, never "1" or "0" for a simulated share ("p ≈ 0.83"). */
export function chanceText(p: number): string {
  return Math.min(0.99, Math.max(0.01, p)).toFixed(2);
}

/** The band at the horizon for people: "80 % interval 6.9–8.4 °C at 60 minutes". */
export function intervalText(p: StoredProjection, unit: string): string {
  const d = bandDecimals(p.interval.upper - p.interval.lower);
  return `${Math.round(p.interval.level * 100)} % interval ${valueText(`${p.interval.lower.toFixed(d)}–${p.interval.upper.toFixed(d)}`, unit)} at ${durationWords(p.horizonMin * 60_000)}`;
}

/**
 * The sentence an early warning opens with: "Cold room 3 · Air is likely (p ≈ 0.83) to pass 8 °C
 * within 60 minutes at its present course — ARMA(1,1) on the remainder after the daily cycle;
 * 80 % interval 6.9–8.4 °C at 60 minutes". It names the model and the interval used.
 */
export function warningOpenedText(watched: string, p: StoredProjection, unit: string): string {
  const pass = p.side === 'high' ? 'rise above' : 'fall below';
  return (
    `${watched} is likely (p ≈ ${chanceText(p.chance)}) to ${pass} ${valueText(formatValue(p.limit), unit)} within ` +
    `${durationWords(p.horizonMin * 60_000)} at its present course — ${p.model}; ${intervalText(p, unit)}`
  );
}

/** Why an early warning resolved itself. */
export type WarningEnd =
  { why: 'fell-back'; projection: StoredProjection } | { why: 'crossed' } | { why: 'not-projected'; detail: string } | { why: 'rule-changed' };

/** The sentence an early warning resolves with. */
export function warningResolvedText(end: WarningEnd, unit: string): string {
  switch (end.why) {
    case 'fell-back':
      return `the projection fell back (p ≈ ${chanceText(end.projection.chance)} of passing ${valueText(formatValue(end.projection.limit), unit)} within ${durationWords(end.projection.horizonMin * 60_000)})`;
    case 'crossed':
      return 'the limit was passed: the limit alert takes over';
    case 'not-projected':
      return `no projection can be made now: ${end.detail}`;
    case 'rule-changed':
      return 'the early warning was switched off on the rule';
  }
}
