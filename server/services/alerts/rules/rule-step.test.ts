import { describe, expect, it } from 'vitest';
import { durationWords, withUnit } from './rule-step.ts';
import { evaluateBounds } from './bounds-rule.ts';
import { evaluateRate } from './rate-rule.ts';
import { FRESH_MEMORY } from './rule-step.ts';

describe('alert texts', () => {
  it('writes a value with the channel unit, or alone when the channel has none', () => {
    expect(withUnit(12.4, '°C')).toBe('12.4 °C');
    // a value's own resolution, at most six decimals
    expect(withUnit(-0.000012345678, ' %RH ')).toBe('-0.000012 %RH');
    // or the channel's resolution when the caller knows it
    expect(withUnit(16.94, '°C', 1)).toBe('16.9 °C');
    expect(withUnit(3, '')).toBe('3');
  });

  it('says durations in words, rounded to what a person reads', () => {
    expect(durationWords(1_000)).toBe('1 second');
    expect(durationWords(90_000)).toBe('90 seconds');
    expect(durationWords(15 * 60_000)).toBe('15 minutes');
    expect(durationWords(2 * 3_600_000)).toBe('2 hours');
    expect(durationWords(2.5 * 3_600_000)).toBe('2 hours 30 minutes');
    expect(durationWords(3 * 86_400_000 + 3_600_000)).toBe('3 days 1 hour');
  });

  it('gives every limit and value of a rule the unit it is measured in', () => {
    const t0 = Date.UTC(2026, 0, 2);
    const bounds = evaluateBounds(
      { low: null, high: 10, holdS: 900 },
      FRESH_MEMORY,
      [
        { ts: t0, value: 11 },
        { ts: t0 + 15 * 60_000, value: 12.4 },
      ],
      '°C',
    );
    expect(bounds.transitions.map((x) => x.detail)).toEqual(['12.4 °C is above the high limit 10 °C for 15 minutes']);
    const rate = evaluateRate(
      { maxPerMinute: 0.5, direction: 'either' },
      FRESH_MEMORY,
      [
        { ts: t0, value: 4 },
        { ts: t0 + 60_000, value: 7 },
      ],
      '°C',
    );
    expect(rate.transitions.map((x) => x.detail)).toEqual(['changed at +3 °C per minute (limit 0.5 °C per minute)']);
  });
});
