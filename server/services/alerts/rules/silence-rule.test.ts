import { describe, expect, it } from 'vitest';
import { evaluateSilence } from './silence-rule.ts';

// Simulated clock: a logger expected every 60 s, silence limit 3 × 60 s = 180 s (the rule's definition).
const t0 = Date.UTC(2026, 5, 1, 12);
const base = { watchingSince: t0 - 86_400_000, expectedIntervalS: 60, factor: 3 };

describe('evaluateSilence', () => {
  const cases: Array<{ name: string; last: number | null; open: boolean; nowS: number; want: { open: boolean; kind?: string; atS?: number } }> = [
    { name: 'heard 179 s ago: fine', last: t0, open: false, nowS: 179, want: { open: false } },
    { name: 'exactly at the limit: still fine', last: t0, open: false, nowS: 180, want: { open: false } },
    { name: 'past the limit: opens at the moment the limit passed', last: t0, open: false, nowS: 600, want: { open: true, kind: 'open', atS: 180 } },
    { name: 'still silent while open: no new transition', last: t0, open: true, nowS: 900, want: { open: true } },
    { name: 'a new reading resolves', last: t0 + 850_000, open: true, nowS: 900, want: { open: false, kind: 'resolve', atS: 850 } },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const r = evaluateSilence({ ...base, lastReadingTs: c.last, open: c.open, now: t0 + c.nowS * 1000 });
      expect(r.open).toBe(c.want.open);
      expect(r.transition?.kind).toBe(c.want.kind);
      if (c.want.atS !== undefined) expect(r.transition!.ts).toBe(t0 + c.want.atS * 1000);
    });
  }

  it('a target already silent when the rule is made opens at the first check', () => {
    const r = evaluateSilence({ ...base, watchingSince: t0 + 3_600_000, lastReadingTs: t0, open: false, now: t0 + 3_600_001 });
    expect(r.transition).toMatchObject({ kind: 'open', ts: t0 + 180_000 });
  });

  it('counts from the start of watching when nothing ever reported', () => {
    const since = t0;
    expect(evaluateSilence({ ...base, watchingSince: since, lastReadingTs: null, open: false, now: since + 100_000 }).transition).toBeNull();
    const r = evaluateSilence({ ...base, watchingSince: since, lastReadingTs: null, open: false, now: since + 200_000 });
    expect(r.transition).toMatchObject({ kind: 'open', ts: since + 180_000, detail: 'no reading ever arrived (limit 3 minutes)' });
  });
});
