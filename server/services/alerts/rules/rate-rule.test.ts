import { describe, expect, it } from 'vitest';
import { evaluateRate, type RateParams } from './rate-rule.ts';
import { FRESH_MEMORY, type RuleReading } from './rule-step.ts';

// Simulated clock; rates are (Δvalue / Δminutes) by definition (common practice), checked by hand below.
const t0 = Date.UTC(2026, 5, 1, 12);
const readings = (pairs: Array<[minute: number, value: number]>): RuleReading[] => pairs.map(([m, value]) => ({ ts: t0 + m * 60_000, value }));

describe('evaluateRate', () => {
  const either: RateParams = { maxPerMinute: 0.5, direction: 'either' };
  const cases: Array<{ name: string; params: RateParams; input: Array<[number, number]>; want: Array<[string, number]> }> = [
    {
      name: 'slow drift: nothing',
      params: either,
      input: [
        [0, 4],
        [1, 4.4],
        [2, 4.8],
        [3, 5.2],
      ],
      want: [],
    },
    // 4 → 6 in 2 min = +1/min > 0.5: opens at minute 2; 6 → 6.2 in 1 min = +0.2: resolves at minute 3
    {
      name: 'a jump opens, the next calm step resolves',
      params: either,
      input: [
        [0, 4],
        [2, 6],
        [3, 6.2],
      ],
      want: [
        ['open', 2],
        ['resolve', 3],
      ],
    },
    // 10 → 9 in 1 min = −1/min: a fall, ignored by a rise-only rule
    {
      name: 'rise-only ignores falls',
      params: { maxPerMinute: 0.5, direction: 'rise' },
      input: [
        [0, 10],
        [1, 9],
        [2, 9],
      ],
      want: [],
    },
    {
      name: 'fall-only catches falls',
      params: { maxPerMinute: 0.5, direction: 'fall' },
      input: [
        [0, 10],
        [1, 9],
        [2, 9],
      ],
      want: [
        ['open', 1],
        ['resolve', 2],
      ],
    },
    // exactly 0.5/min is allowed
    {
      name: 'a rate equal to the limit is allowed',
      params: either,
      input: [
        [0, 0],
        [2, 1],
      ],
      want: [],
    },
    {
      name: 'readings at the same time are not compared',
      params: either,
      input: [
        [0, 0],
        [0, 100],
        [1, 0.1],
      ],
      want: [],
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const step = evaluateRate(c.params, FRESH_MEMORY, Object.freeze(readings(c.input)));
      expect(step.transitions.map((t) => [t.kind, (t.ts - t0) / 60_000])).toEqual(c.want);
    });
  }

  it('compares the first reading of a batch with the last of the previous one', () => {
    const first = evaluateRate(either, FRESH_MEMORY, readings([[0, 4]]));
    expect(first.transitions).toEqual([]);
    const second = evaluateRate(either, first.memory, readings([[1, 7]]));
    expect(second.transitions).toEqual([{ kind: 'open', ts: t0 + 60_000, value: 7, detail: 'changed at +3 per minute (limit 0.5 per minute)' }]);
  });
});
