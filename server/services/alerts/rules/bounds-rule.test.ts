import { describe, expect, it } from 'vitest';
import { evaluateBounds, type BoundsParams } from './bounds-rule.ts';
import { FRESH_MEMORY, type RuleReading } from './rule-step.ts';

// Simulated clock: one reading a minute from t0; the cases are the rule's own definition
// (common practice for threshold alarms with a hold time), no outside source is needed.
const t0 = Date.UTC(2026, 5, 1, 12);
const at = (values: number[]): RuleReading[] => values.map((value, i) => ({ ts: t0 + i * 60_000, value }));
const freezer: BoundsParams = { low: null, high: -15, holdS: 300 };

describe('evaluateBounds', () => {
  const cases: Array<{ name: string; params: BoundsParams; values: number[]; want: Array<[kind: 'open' | 'resolve', index: number]> }> = [
    { name: 'stays inside: nothing', params: freezer, values: [-20, -19, -18, -20], want: [] },
    { name: 'one noisy reading above is held back', params: freezer, values: [-20, -5, -20, -20, -20, -20, -20, -20], want: [] },
    { name: 'four minutes above (< hold of 5 min): nothing', params: freezer, values: [-20, -10, -10, -10, -10, -10, -20], want: [] },
    {
      name: 'opens at the reading 5 min after the first one above, resolves at the first inside',
      params: freezer,
      values: [-20, -10, -10, -10, -10, -10, -10, -20, -19],
      want: [
        ['open', 6],
        ['resolve', 7],
      ],
    },
    { name: 'a reading inside restarts the hold', params: freezer, values: [-10, -10, -10, -10, -20, -10, -10, -10, -10, -10, -10], want: [['open', 10]] },
    {
      name: 'no hold: opens at the first reading below the low limit',
      params: { low: 2, high: 8, holdS: 0 },
      values: [5, 1.9, 1.5, 4],
      want: [
        ['open', 1],
        ['resolve', 3],
      ],
    },
    { name: 'a reading exactly at the limit is inside', params: { low: 2, high: 8, holdS: 0 }, values: [8, 2, 8.0001], want: [['open', 2]] },
    {
      name: 'jumping from below to above keeps one alert open',
      params: { low: 2, high: 8, holdS: 0 },
      values: [1, 9, 5],
      want: [
        ['open', 0],
        ['resolve', 2],
      ],
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const readings = Object.freeze(at(c.values));
      const step = evaluateBounds(c.params, FRESH_MEMORY, readings);
      expect(step.transitions.map((t) => [t.kind, (t.ts - t0) / 60_000])).toEqual(c.want);
      for (const t of step.transitions) expect(t.value).toBe(c.values[(t.ts - t0) / 60_000]);
    });
  }

  it('carries a pending hold across evaluations (split anywhere, same transitions)', () => {
    const values = [-20, -10, -10, -10, -10, -10, -10, -20];
    const whole = evaluateBounds(freezer, FRESH_MEMORY, at(values)).transitions;
    for (let split = 0; split <= values.length; split++) {
      const first = evaluateBounds(freezer, FRESH_MEMORY, at(values).slice(0, split));
      const second = evaluateBounds(freezer, first.memory, at(values).slice(split));
      expect([...first.transitions, ...second.transitions]).toEqual(whole);
    }
  });

  it('says what was seen', () => {
    const [open] = evaluateBounds(freezer, FRESH_MEMORY, at([-10, -10, -10, -10, -10, -10])).transitions;
    expect(open.detail).toBe('-10 is above the high limit -15 for 5 minutes');
  });

  it('an empty batch changes nothing', () => {
    const memory = { pendingSince: t0, previous: { ts: t0, value: -10 }, open: false };
    expect(evaluateBounds(freezer, memory, [])).toEqual({ memory, transitions: [] });
  });
});
