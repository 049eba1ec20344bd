import type { TimeRange } from '@shared/contract/channels.ts';

export type RangePreset = '24h' | '7d' | '30d' | '90d' | '1y';

/** The preset ranges of the readings chart, each ending now. */
export const RANGE_PRESETS: Array<{ id: RangePreset; label: string; ms: number }> = [
  { id: '24h', label: '24 h', ms: 86_400_000 },
  { id: '7d', label: '7 d', ms: 7 * 86_400_000 },
  { id: '30d', label: '30 d', ms: 30 * 86_400_000 },
  { id: '90d', label: '90 d', ms: 90 * 86_400_000 },
  { id: '1y', label: '1 y', ms: 365 * 86_400_000 },
];

/** The range of `preset` ending at `now` rounded up to the whole minute (so repeated clicks hit the same cached series). */
export function presetRange(preset: RangePreset, now: number): TimeRange {
  const to = Math.ceil(now / 60_000) * 60_000;
  return { from: to - RANGE_PRESETS.find((p) => p.id === preset)!.ms, to };
}

/** Shortest range a zoom may narrow to: ten minutes. */
export const MIN_ZOOM_MS = 10 * 60_000;

/**
 * The part of `range` a zoom window (fractions 0…1 of the axis) shows, widened about its middle
 * to at least {@link MIN_ZOOM_MS} and rounded outward to whole seconds.
 */
export function zoomedRange(range: TimeRange, start: number, end: number): TimeRange {
  const span = range.to - range.from;
  let from = range.from + Math.max(0, Math.min(1, start)) * span;
  let to = range.from + Math.max(0, Math.min(1, end)) * span;
  if (to - from < MIN_ZOOM_MS) {
    const mid = (from + to) / 2;
    from = mid - MIN_ZOOM_MS / 2;
    to = mid + MIN_ZOOM_MS / 2;
  }
  return { from: Math.floor(from / 1000) * 1000, to: Math.ceil(to / 1000) * 1000 };
}
