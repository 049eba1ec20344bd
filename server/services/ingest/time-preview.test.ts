import { describe, expect, it } from 'vitest';
import { previewUploadTimes } from './time-preview.ts';
import { ValidationError } from '../../errors.ts';

// Instants from the IANA tz database rules for Europe/Berlin (CET = UTC+1 in winter, CEST = UTC+2 in summer).
describe('previewUploadTimes', () => {
  it('with auto, a day-first column that ingestion cannot read is read with the guessed layout, which the answer names', () => {
    const answer = previewUploadTimes({ samples: ['24.11.2026 00:00', '24.11.2026 00:15', ''], timeFormat: 'auto', timeZone: 'Europe/Berlin' });
    expect(answer.layout).toBe('day-first-dot');
    expect(answer.readable).toBe(true);
    expect(answer.rows[0]).toEqual({
      row: 1,
      text: '24.11.2026 00:00',
      utc: '2026-11-23T23:00:00.000Z',
      local: '2026-11-24 00:00:00',
      problem: null,
      ambiguous: false,
    });
    expect(answer.rows[2]).toMatchObject({ utc: null, problem: null });
  });

  it('keeps auto when ingestion reads every sample (ISO 8601 without offset, in the zone)', () => {
    const answer = previewUploadTimes({ samples: ['2026-07-01T12:00:00'], timeFormat: 'auto', timeZone: 'Europe/Berlin' });
    expect(answer).toMatchObject({ layout: 'auto', readable: true });
    expect(answer.rows[0].utc).toBe('2026-07-01T10:00:00.000Z');
  });

  it('flags rows the layouts read differently (03/04/2026: 4 March or 3 April) while no row settles it', () => {
    const answer = previewUploadTimes({ samples: ['03/04/2026 08:00', '05/04/2026 08:00'], timeFormat: 'month-first-slash', timeZone: 'UTC' });
    expect(answer.rows.map((r) => r.ambiguous)).toEqual([true, true]);
    expect(answer.rows[0].utc).toBe('2026-03-04T08:00:00.000Z');
    expect(answer.guess.chosen).toBeNull();
  });

  it('says why a row fails with the chosen layout, and which layout the rows suggest (a day above 12 settles it)', () => {
    const answer = previewUploadTimes({ samples: ['03/04/2026 08:00', '13/04/2026 08:00'], timeFormat: 'month-first-slash', timeZone: 'UTC' });
    expect(answer.rows[1].utc).toBeNull();
    expect(answer.rows[1].problem).toMatch(/^ts: /);
    expect(answer.readable).toBe(false);
    expect(answer.guess.chosen).toBe('day-first-slash');
    expect(answer.rows[0].ambiguous).toBe(false);
  });

  it('with auto and nothing that reads the samples, gives no layout and the reason', () => {
    const answer = previewUploadTimes({ samples: ['yesterday noon'], timeFormat: 'auto', timeZone: 'UTC' });
    expect(answer).toMatchObject({ layout: null, readable: false });
    expect(answer.guess.reason).toMatch(/^ts: no layout reads row 1/);
  });

  it('reads a custom pattern, and refuses one it cannot read as timePattern: …', () => {
    expect(previewUploadTimes({ samples: ['2026/12/01 06.30'], timeFormat: 'pattern', timePattern: 'yyyy/MM/dd HH.mm', timeZone: 'UTC' }).rows[0].utc).toBe(
      '2026-12-01T06:30:00.000Z',
    );
    expect(() => previewUploadTimes({ samples: ['x'], timeFormat: 'pattern', timePattern: 'yyyy QQQ', timeZone: 'UTC' })).toThrow(ValidationError);
  });
});
