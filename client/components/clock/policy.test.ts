import { describe, expect, it } from 'vitest';
import { myTimeZone, shownZone } from './policy.ts';

// The policy of issue #19 item 1: readings on the logger's clock by default, everything else on
// the person's; `mine` and `utc` override both kinds.
describe('shownZone', () => {
  const base = { myZone: 'America/New_York', loggerZone: 'Asia/Kolkata' };
  it('logger clock: readings on the logger, the rest on mine', () => {
    expect(shownZone({ ...base, kind: 'readings', choice: 'logger' })).toBe('Asia/Kolkata');
    expect(shownZone({ ...base, kind: 'account', choice: 'logger' })).toBe('America/New_York');
  });
  it('my clock: both kinds on mine', () => {
    expect(shownZone({ ...base, kind: 'readings', choice: 'mine' })).toBe('America/New_York');
    expect(shownZone({ ...base, kind: 'account', choice: 'mine' })).toBe('America/New_York');
  });
  it('UTC: both kinds on UTC', () => {
    expect(shownZone({ ...base, kind: 'readings', choice: 'utc' })).toBe('UTC');
    expect(shownZone({ ...base, kind: 'account', choice: 'utc' })).toBe('UTC');
  });
  it('no logger (or an unknown logger zone): readings fall back to my zone', () => {
    expect(shownZone({ myZone: 'Europe/Berlin', kind: 'readings', choice: 'logger' })).toBe('Europe/Berlin');
    expect(shownZone({ myZone: 'Europe/Berlin', loggerZone: 'Mars/Olympus', kind: 'readings', choice: 'logger' })).toBe('Europe/Berlin');
  });
});

describe('myTimeZone', () => {
  it('takes the saved zone, else the browser’s, else UTC', () => {
    expect(myTimeZone('Australia/Adelaide', () => 'Europe/Berlin')).toBe('Australia/Adelaide');
    expect(myTimeZone(null, () => 'Europe/Berlin')).toBe('Europe/Berlin');
    expect(myTimeZone(undefined, () => '')).toBe('UTC');
  });
  it('ignores a saved or browser zone the platform does not know', () => {
    expect(myTimeZone('Europe/Atlantis', () => 'Asia/Tokyo')).toBe('Asia/Tokyo');
    expect(myTimeZone('Europe/Atlantis', () => 'Nowhere/Else')).toBe('UTC');
  });
});
