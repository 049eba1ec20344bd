import { describe, expect, it } from 'vitest';
import { MAX_TOGETHER, readTogetherParams, withRangeAndZone, writeTogetherParams } from './together-url.ts';

const read = (q: string) => readTogetherParams(new URLSearchParams(q));
const RANGE = { from: Date.parse('2026-03-28T00:00:00Z'), to: Date.parse('2026-03-30T00:00:00Z') };

describe('readTogetherParams / writeTogetherParams', () => {
  it('reads back what it wrote, with no problems', () => {
    const v = { ids: [12, 15, 19], range: RANGE, zone: 'America/New_York' };
    const q = writeTogetherParams(v);
    expect(q.toString()).toBe(`channels=12%2C15%2C19&from=${RANGE.from}&to=${RANGE.to}&zone=America%2FNew_York`);
    expect(readTogetherParams(q)).toEqual({ ...v, problems: [] });
  });

  it('takes a link without range or zone as the defaults, silently', () => {
    expect(read('channels=3')).toEqual({ ids: [3], range: null, zone: null, problems: [] });
    expect(read('')).toEqual({ ids: [], range: null, zone: null, problems: [] });
  });

  it('leaves out what is not a channel number, naming it, and keeps the rest in order', () => {
    const r = read('channels=7,abc,-2,0,1.5,,9');
    expect(r.ids).toEqual([7, 9]);
    expect(r.problems).toEqual(['channels: “abc”, “-2”, “0”, “1.5” are not channel numbers; left out.']);
  });

  it('draws a repeated channel once and says so', () => {
    const r = read('channels=4,5,4,4');
    expect(r.ids).toEqual([4, 5]);
    expect(r.problems).toEqual(['channels: 4 listed more than once; drawn once.']);
  });

  it('keeps the first six of more, naming the ones left out', () => {
    const r = read('channels=1,2,3,4,5,6,7,8');
    expect(MAX_TOGETHER).toBe(6);
    expect(r.ids).toEqual([1, 2, 3, 4, 5, 6]);
    expect(r.problems).toEqual(['channels: 8 channels asked for, but one chart takes at most 6; kept the first 6 (1, 2, 3, 4, 5, 6), left out 7, 8.']);
  });

  it('cuts a hostile token short in the message', () => {
    expect(read(`channels=${'x'.repeat(500)}`).problems[0]).toBe(`channels: “${'x'.repeat(24)}…” is not a channel number; left out.`);
  });

  it.each([
    ['from=5', 'to: missing (a range needs both from and to); showing the last 7 days instead.'],
    ['from=yesterday&to=5', 'from: “yesterday” is not a time in epoch milliseconds; showing the last 7 days instead.'],
    ['from=1&to=99999999999999999999', 'to: “99999999999999999999” is not a time in epoch milliseconds; showing the last 7 days instead.'],
    ['from=10&to=10', 'to: must be after from; showing the last 7 days instead.'],
    ['from=0&to=946080000000', 'to: the range must be at most 20 years; showing the last 7 days instead.'],
  ])('refuses the range %s with a message and falls back to the default', (q, message) => {
    const r = read(`channels=1&${q}`);
    expect(r.range).toBeNull();
    expect(r.problems).toEqual([message]);
    expect(r.ids).toEqual([1]);
  });

  it('replaces range and zone, keeping the channel list exactly as written', () => {
    const next = withRangeAndZone(new URLSearchParams('channels=1,x&zone=UTC'), RANGE, null);
    expect(next.get('channels')).toBe('1,x');
    expect(next.has('zone')).toBe(false);
    expect(readTogetherParams(next).range).toEqual(RANGE);
  });
});
