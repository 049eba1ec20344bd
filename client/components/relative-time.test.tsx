import { describe, expect, it } from 'vitest';
import { relativeTimeText } from './relative-time.tsx';

const NOW = Date.UTC(2026, 8, 15, 12, 0, 0);
const at = (ms: number) => new Date(NOW + ms).toISOString();
const MIN = 60_000;

// Expected wording: CLDR English as Intl.RelativeTimeFormat('en', { numeric: 'auto' }) words it
// (ECMA-402); the choice of unit and the truncation are what is tested here.
describe('relativeTimeText', () => {
  it('uses the largest whole unit, truncating toward now', () => {
    expect(relativeTimeText(at(-5 * MIN), NOW, 'en')).toBe('5 minutes ago');
    expect(relativeTimeText(at(-90 * MIN), NOW, 'en')).toBe('1 hour ago');
    expect(relativeTimeText(at(-36 * 60 * MIN), NOW, 'en')).toBe('yesterday');
    expect(relativeTimeText(at(-20 * 24 * 60 * MIN), NOW, 'en')).toBe('2 weeks ago');
    expect(relativeTimeText(at(2 * 60 * MIN), NOW, 'en')).toBe('in 2 hours');
  });

  it('says "now" under a second and returns unreadable input unchanged', () => {
    expect(relativeTimeText(at(-400), NOW, 'en')).toBe('now');
    expect(relativeTimeText('not a time', NOW, 'en')).toBe('not a time');
  });
});
