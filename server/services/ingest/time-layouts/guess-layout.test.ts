import { describe, expect, it } from 'vitest';
import { guessLayout, rowList } from './guess-layout.ts';

// Instants: Europe/Berlin is UTC+1 in winter and UTC+2 in summer (IANA tz database);
// 2026-04-03 00:00 Berlin = 2026-04-02T22:00Z and 2026-03-04 00:00 = 2026-03-03T23:00Z
// (python zoneinfo on this machine: 1775167200000 and 1772578800000).
describe('guessLayout', () => {
  it('settles day-first from a sample with a day above 12', () => {
    const g = guessLayout(['24.11.2026 00:00', '24.11.2026 00:15', '24.11.2026 00:30'], 'Europe/Berlin');
    expect(g).toEqual({ candidates: ['day-first-dot'], chosen: 'day-first-dot', ambiguousRows: [] });
    expect(guessLayout(['03/04/2026 00:00', '25/04/2026 00:00']).chosen).toBe('day-first-slash');
    expect(guessLayout(['03/04/2026 00:00', '04/25/2026 00:00']).chosen).toBe('month-first-slash');
  });

  it('flags rows that read as two different days and chooses nothing', () => {
    const g = guessLayout(['03/04/2026 00:00', '05/04/2026 00:00', '06/06/2026 00:00'], 'Europe/Berlin');
    expect(g.candidates).toEqual(['day-first-slash', 'month-first-slash']);
    expect(g.chosen).toBeNull();
    expect(g.ambiguousRows.map((r) => r.row)).toEqual([1, 2]); // 06/06 is the same day either way
    expect(g.ambiguousRows[0].readings).toEqual([
      { layout: 'day-first-slash', ts: Date.UTC(2026, 3, 2, 22) },
      { layout: 'month-first-slash', ts: Date.UTC(2026, 2, 3, 23) },
    ]);
    expect(g.reason).toMatch(/^ts: rows 1–2 read as different times with day first, dd\/mm\/yyyy .* or month first/);
  });

  it('chooses when both orders agree on every row', () => {
    expect(guessLayout(['06/06/2026 10:00'])).toMatchObject({ chosen: 'day-first-slash', ambiguousRows: [] });
  });

  it('tells epoch seconds, epoch milliseconds and serial days apart by plausible dates', () => {
    expect(guessLayout(['1795474800', '1795475700']).candidates).toEqual(['epoch-s']);
    expect(guessLayout(['1795474800000']).candidates).toEqual(['epoch-ms']);
    expect(guessLayout(['46350', '46350.25']).candidates).toEqual(['serial-1900']);
  });

  it('recognises ISO, with or without an offset, and 12-hour times', () => {
    expect(guessLayout(['2026-11-24T00:00:00Z', '2026-11-24 00:15']).chosen).toBe('iso');
    expect(guessLayout(['11/24/2026 1:30 PM']).chosen).toBe('month-first-slash-12h');
    expect(guessLayout(['24/11/2026 1:30 PM']).chosen).toBe('day-first-slash-12h');
  });

  it('names the row no layout reads and the layout that reads the most', () => {
    const g = guessLayout(['24.11.2026 00:00', 'n/a', '24.11.2026 00:30', '24.11.2026 00:45']);
    expect(g).toMatchObject({ candidates: [], chosen: null, ambiguousRows: [] });
    expect(g.reason).toBe('ts: no layout reads row 2 ("n/a"); day first, dd.mm.yyyy HH:mm[:ss] would read rows 1, 3–4');
  });

  it('says when every row is readable but by different layouts', () => {
    expect(guessLayout(['24.11.2026 00:00', '24.11.2026 00:15', '2026-11-24T00:30']).reason).toBe(
      'ts: no single layout reads every sample row; day first, dd.mm.yyyy HH:mm[:ss] would read rows 1–2',
    );
  });

  it('skips blank samples, and refuses when there are none', () => {
    expect(guessLayout(['', '  ', '24.11.2026 00:00']).chosen).toBe('day-first-dot');
    expect(guessLayout(['', ' '])).toEqual({ candidates: [], chosen: null, ambiguousRows: [], reason: 'ts: no sample rows to guess the layout from' });
    expect(guessLayout(['x', 'y']).reason).toBe('ts: no layout reads row 1 ("x"); no layout reads any of them');
  });

  it('guesses in the logger zone, so a sample in a daylight-saving gap is not read', () => {
    expect(guessLayout(['29.03.2026 02:30'], 'Europe/Berlin').chosen).toBeNull();
    expect(guessLayout(['29.03.2026 02:30'], 'UTC').chosen).toBe('day-first-dot');
  });
});

describe('rowList', () => {
  it('joins runs of rows', () => {
    expect(rowList([2])).toBe('row 2');
    expect(rowList([1, 2, 3, 5, 7, 8])).toBe('rows 1–3, 5, 7–8');
  });
});
