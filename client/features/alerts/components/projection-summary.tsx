import type { AlertProjection } from '@shared/contract/alerts.ts';
import { bandWords, chanceWords, EARLY_WARNING_CAUTION, lookAheadWords } from './early-warning-words.ts';

/**
 * What an early warning was based on, in a few words: the model, the chance of passing the limit
 * within the look-ahead, the central interval at its end and, when simulated paths cross, the
 * median time to the crossing; then the caution that it is an estimate, not a safety system.
 */
export function ProjectionSummary({ projection: p, unit: given }: { projection: AlertProjection; unit: string }) {
  // the server stores the channel's unit with the projection; the list's own unit wins when it has one
  const unit = given.trim() || p.unit || '';
  const limit = `${p.limit}${unit.trim() ? ` ${unit.trim()}` : ''}`;
  return (
    <div className="grid gap-1 text-sm">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5">
        <dt className="text-ink-soft">Model</dt>
        <dd>{p.model}</dd>
        <dt className="text-ink-soft">Chance</dt>
        <dd>
          {chanceWords(p.chance)} of {p.side === 'high' ? 'rising above' : 'falling below'} {limit} within {lookAheadWords(p.horizonMin)}
          {p.medianMinutesToCross !== null && ` (typically after about ${lookAheadWords(Math.max(1, p.medianMinutesToCross))})`}
        </dd>
        <dt className="text-ink-soft">Interval</dt>
        <dd>
          {Math.round(p.interval.level * 100)} % interval {bandWords(p.interval.lower, p.interval.upper, unit)} in {lookAheadWords(p.horizonMin)}
        </dd>
      </dl>
      <p className="text-ink-soft">{EARLY_WARNING_CAUTION}</p>
    </div>
  );
}
