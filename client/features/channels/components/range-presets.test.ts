import { describe, expect, it } from 'vitest';
import { MIN_ZOOM_MS, presetRange, zoomedRange } from './range-presets.ts';

// Plain arithmetic on epoch milliseconds, worked by hand.
describe('range presets and zoom', () => {
  it('ends a preset at the next whole minute', () => {
    const now = Date.parse('2026-05-04T10:20:30.500Z');
    expect(presetRange('24h', now)).toEqual({ from: Date.parse('2026-05-03T10:21:00Z'), to: Date.parse('2026-05-04T10:21:00Z') });
    expect(presetRange('7d', Date.parse('2026-05-04T10:21:00Z')).from).toBe(Date.parse('2026-04-27T10:21:00Z'));
  });

  it('maps a zoom window onto the range, never narrower than ten minutes', () => {
    const range = { from: 0, to: 86_400_000 };
    expect(zoomedRange(range, 0.25, 0.5)).toEqual({ from: 21_600_000, to: 43_200_000 });
    const narrow = zoomedRange(range, 0.5, 0.5);
    expect(narrow.to - narrow.from).toBe(MIN_ZOOM_MS);
    expect((narrow.from + narrow.to) / 2).toBe(43_200_000);
  });
});
