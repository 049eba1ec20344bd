import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BatchCandidates } from './batch-candidates.ts';

const rowsOf = (c: BatchCandidates) => {
  const { columns, rowAt } = c.sorted();
  return Array.from({ length: columns.length }, (_, i) => [columns.channelId[i], columns.ts[i], columns.value[i], rowAt[i]]);
};

describe('BatchCandidates', () => {
  it('keeps the first value of a (channel, time); the same value again is a duplicate, another a conflict', () => {
    const c = new BatchCandidates(4);
    expect(c.offer(7, 1000, 1.5, 0)).toBe('added');
    expect(c.offer(7, 1000, 1.5, 1)).toBe('duplicate');
    expect(c.offer(7, 1000, 2.5, 2)).toBe('conflict');
    expect(c.offer(8, 1000, 2.5, 3)).toBe('added');
    expect(rowsOf(c)).toEqual([
      [7, 1000, 1.5, 0],
      [8, 1000, 2.5, 3],
    ]);
  });

  it('catches a repeat after a channel’s times went back, and sorts that channel by time', () => {
    const c = new BatchCandidates(6);
    expect(c.offer(5, 3000, 3, 0)).toBe('added');
    expect(c.offer(5, 1000, 1, 1)).toBe('added');
    expect(c.offer(5, 4000, 4, 2)).toBe('added');
    expect(c.offer(5, 1000, 1, 3)).toBe('duplicate');
    expect(c.offer(5, 3000, 9, 4)).toBe('conflict');
    expect(rowsOf(c)).toEqual([
      [5, 1000, 1, 1],
      [5, 3000, 3, 0],
      [5, 4000, 4, 2],
    ]);
  });

  it('orders by channel id, then time, and gives one run per channel', () => {
    const c = new BatchCandidates(6);
    // a logger sending its channels interleaved, ids not in key order (ids beyond 2^31 as new-id makes them)
    const ids = [292514377061, 12, 4_000_000_000];
    for (let t = 0; t < 2; t++) ids.forEach((id, k) => c.offer(id, 60_000 * t, k + t / 10, t * 3 + k));
    const { runs } = c.sorted();
    expect(runs).toEqual([
      { channelId: 12, from: 0, to: 2 },
      { channelId: 4_000_000_000, from: 2, to: 4 },
      { channelId: 292514377061, from: 4, to: 6 },
    ]);
    expect(rowsOf(c).map((r) => r[3])).toEqual([1, 4, 2, 5, 0, 3]);
  });

  it('matches a plain reference (first value per key kept, rest sorted) for any offers', () => {
    const offer = fc.record({ channel: fc.integer({ min: 1, max: 4 }), ts: fc.integer({ min: 0, max: 20 }), value: fc.integer({ min: 0, max: 2 }) });
    fc.assert(
      fc.property(fc.array(offer, { maxLength: 60 }), (offers) => {
        const c = new BatchCandidates(offers.length);
        const first = new Map<string, { channel: number; ts: number; value: number; row: number }>();
        offers.forEach((o, row) => {
          const key = `${o.channel}|${o.ts}`;
          const kept = first.get(key);
          const expected = !kept ? 'added' : kept.value === o.value ? 'duplicate' : 'conflict';
          if (!kept) first.set(key, { ...o, row });
          expect(c.offer(o.channel, o.ts, o.value, row)).toBe(expected);
        });
        const reference = [...first.values()].sort((a, b) => a.channel - b.channel || a.ts - b.ts).map((o) => [o.channel, o.ts, o.value, o.row]);
        expect(rowsOf(c)).toEqual(reference);
      }),
    );
  });
});
