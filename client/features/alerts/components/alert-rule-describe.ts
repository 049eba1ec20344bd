import type { AlertRule } from '@shared/contract/alerts.ts';
import { durationWords } from '../messages.ts';

const n = (v: unknown) => String(v);

/** One line saying what a rule watches for, in words (for lists and the channel page). */
export function describeAlertRule(rule: Pick<AlertRule, 'kind' | 'params' | 'watched'>): string {
  const p = rule.params;
  const unit = rule.watched.unit ? ` ${rule.watched.unit}` : '';
  switch (rule.kind) {
    case 'silence':
      return `No reading for more than ${n(p.factor)} × the expected interval`;
    case 'bounds': {
      const limits = [
        p.low !== null && p.low !== undefined ? `below ${n(p.low)}${unit}` : null,
        p.high !== null && p.high !== undefined ? `above ${n(p.high)}${unit}` : null,
      ]
        .filter(Boolean)
        .join(' or ');
      const held = `Readings ${limits}${Number(p.holdS) > 0 ? ` for at least ${durationWords(Number(p.holdS))}` : ''}`;
      const w = p.earlyWarning as { horizonMin?: number; chance?: number } | null | undefined;
      return w && typeof w.horizonMin === 'number' && typeof w.chance === 'number'
        ? `${held}; warns when a crossing within ${durationWords(w.horizonMin * 60)} is at least ${Math.round(w.chance * 100)} % likely`
        : held;
    }
    case 'rate':
      return `${p.direction === 'rise' ? 'Rises' : p.direction === 'fall' ? 'Falls' : 'Changes'} faster than ${n(p.maxPerMinute)}${unit} per minute`;
    case 'unusual':
      return `A reading more than ${n(p.k)} robust SD off its usual ${n(p.periodH)} h pattern`;
  }
}
