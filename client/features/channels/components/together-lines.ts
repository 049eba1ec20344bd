import type { ChannelState } from '@shared/contract/channels.ts';
import { TOGETHER_LOOKS, type LineLook } from './together-looks.ts';

/** Most value axes one chart shows: one on the left, two on the right (more would crush the plot on a phone). */
export const MAX_AXES = 3;

/** A value axis of the chart: every line of one unit shares it. */
export interface AxisPlan {
  unit: string | null;
  /** The axis title: the unit, or "no unit". */
  name: string;
  position: 'left' | 'right';
  /** Pixels the axis sits out from the plot's edge (the second axis on the right stands beside the first). */
  offset: number;
}

/** A channel that will be drawn: which axis it uses, how it looks and what it is called. */
export interface PlannedLine {
  channel: ChannelState;
  /** Index into the axes. */
  axis: number;
  look: LineLook;
  /** `logger · channel (unit)`: the legend, tooltip and CSV header. */
  name: string;
}

/** The unit of a channel as axes group it (empty counts as none). */
const unitOf = (c: ChannelState): string | null => c.unit?.trim() || null;

/** `logger · channel (unit)`, or `logger · channel` for a channel without a unit. */
export function lineName(c: ChannelState): string {
  const unit = unitOf(c);
  return `${c.logger.name} · ${c.label}${unit ? ` (${unit})` : ''}`;
}

/**
 * Gives each channel a value axis — one per unit, in the order the units first appear, so the
 * first channel's unit is on the left — and a look. A channel whose unit would need a fourth
 * axis is not drawn (values of different units on one axis would mislead, and rescaling them
 * would change what the CSV says); `problems` names it and says what to do.
 */
export function planLines(channels: readonly ChannelState[]): { lines: PlannedLine[]; axes: AxisPlan[]; problems: string[] } {
  const axes: AxisPlan[] = [];
  const lines: PlannedLine[] = [];
  const refused: ChannelState[] = [];
  for (const c of channels) {
    const unit = unitOf(c);
    let axis = axes.findIndex((a) => a.unit === unit);
    if (axis < 0) {
      if (axes.length >= MAX_AXES) {
        refused.push(c);
        continue;
      }
      axis = axes.length;
      axes.push({ unit, name: unit ?? 'no unit', position: axis === 0 ? 'left' : 'right', offset: axis === 2 ? 64 : 0 });
    }
    lines.push({ channel: c, axis, look: TOGETHER_LOOKS[lines.length % TOGETHER_LOOKS.length], name: lineName(c) });
  }
  const problems = refused.length
    ? [
        `channels: one chart has at most ${MAX_AXES} value axes (one per unit: ${axes.map((a) => a.name).join(', ')}); not drawn: ${refused
          .map((c) => `${lineName(c)} [${c.id}]`)
          .join(', ')}. Open ${refused.length === 1 ? 'it' : 'them'} on a chart of ${refused.length === 1 ? 'its' : 'their'} own.`,
      ]
    : [];
  return { lines, axes, problems };
}

/** The zones a reader may show the chart in: each drawn channel's logger zone (first channel first), then UTC. */
export function zoneChoices(lines: readonly PlannedLine[]): string[] {
  return [...new Set([...lines.map((l) => l.channel.logger.timezone), 'UTC'])];
}

/**
 * The zone the chart is shown in: the one the URL asks for when it is among `choices`, else
 * `preferred` (the zone the person's clock choice gives; it must be among `choices`) or the first
 * channel's logger zone (with a problem saying so when the URL asked for another).
 */
export function chooseZone(asked: string | null, choices: readonly string[], preferred?: string): { zone: string; problem: string | null } {
  const fallback = preferred && choices.includes(preferred) ? preferred : (choices[0] ?? 'UTC');
  if (asked === null || choices.includes(asked)) return { zone: asked ?? fallback, problem: null };
  const shown = asked.length > 40 ? `${asked.slice(0, 40)}…` : asked;
  return { zone: fallback, problem: `zone: “${shown}” is neither a zone of these channels’ loggers nor UTC; showing ${fallback}.` };
}
