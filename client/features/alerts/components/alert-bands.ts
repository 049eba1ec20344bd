import type { Alert } from '@shared/contract/alerts.ts';

/** A shaded stretch of the readings chart: when an alert was open. */
export interface AlertBand {
  from: number;
  to: number;
  label: string;
  open: boolean;
}

/**
 * The stretches of `range` during which each alert was open, clipped to the range (an alert
 * still open lasts until `now`), each at least 1/200 of the range wide so a short alert stays
 * visible. Alerts outside the range give no band.
 */
export function alertBands(alerts: readonly Alert[], range: { from: number; to: number }, now: number): AlertBand[] {
  const out: AlertBand[] = [];
  for (const a of alerts) {
    const end = a.resolvedAt ?? now;
    const from = Math.max(a.openedAt, range.from);
    const to = Math.min(Math.max(end, a.openedAt), range.to);
    if (from > to || (from === to && a.resolvedAt !== null)) continue;
    const minWidth = (range.to - range.from) / 200;
    const wideTo = Math.min(Math.max(to, from + minWidth), range.to);
    const stage = a.stage === 'expected' ? ' — expected to cross' : '';
    out.push({ from: Math.min(from, wideTo - minWidth), to: wideTo, label: `${a.ruleName}${stage}${a.open ? ' (open)' : ''}`, open: a.open });
  }
  return out;
}
