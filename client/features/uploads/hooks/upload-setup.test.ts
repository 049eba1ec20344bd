import { describe, expect, it } from 'vitest';
import { uploadOptionsSchema } from '@shared/contract/uploads.ts';
import { guessUploadSetup, toUploadOptions } from './upload-setup.ts';

// Column names of a fictional field logger's export (demo scenario, invented).
const WIDE = ['Timestamp', 'AIR_T', 'rh', 'battery_v'];
const LONG = ['channel', 'time', 'value'];

describe('guessUploadSetup', () => {
  it('finds the time column, chooses wide, and maps columns named like channels (any case)', () => {
    const setup = guessUploadSetup(WIDE, ',', ['air_t', 'rh'], 'Africa/Nairobi');
    expect(setup).toMatchObject({ format: 'wide', timeColumn: 'Timestamp', timeZone: 'Africa/Nairobi', timeFormat: 'auto' });
    expect(setup.columns).toEqual({ AIR_T: 'air_t', rh: 'rh', battery_v: null });
  });

  it('chooses long when the file has channel and value columns', () => {
    expect(guessUploadSetup(LONG, ';', ['air_t'], 'UTC')).toMatchObject({
      format: 'long',
      channelColumn: 'channel',
      valueColumn: 'value',
      timeColumn: 'time',
      delimiter: ';',
    });
  });
});

describe('toUploadOptions', () => {
  it('lists every non-time column in wide format, skipped ones as null, in a shape the server schema accepts unchanged', () => {
    const setup = guessUploadSetup(WIDE, ',', ['air_t', 'rh'], 'Africa/Nairobi');
    const result = toUploadOptions(setup, WIDE);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.options).toEqual({
      format: 'wide',
      delimiter: ',',
      timeColumn: 'Timestamp',
      columns: { AIR_T: 'air_t', rh: 'rh', battery_v: null },
      timeFormat: 'auto',
      timeZone: 'Africa/Nairobi',
    });
    expect(uploadOptionsSchema.parse(JSON.parse(JSON.stringify(result.options)))).toEqual(result.options);
  });

  it('refuses a wide mapping that skips every column, with the server schema’s own message', () => {
    const setup = { ...guessUploadSetup(WIDE, ',', [], 'UTC') };
    const result = toUploadOptions(setup, WIDE);
    expect(result).toEqual({ ok: false, problems: ['Columns and their channels: a wide file needs at least one column stored under a channel.'] });
  });

  it('refuses a long mapping without a value column or with one column used twice', () => {
    const setup = guessUploadSetup(LONG, ',', [], 'UTC');
    expect(toUploadOptions({ ...setup, valueColumn: '' }, LONG)).toEqual({
      ok: false,
      problems: ['File layout: a long file needs its channel column and its value column named.'],
    });
    expect(toUploadOptions({ ...setup, valueColumn: 'time' }, LONG)).toEqual({
      ok: false,
      problems: ['Columns: time, channel and value must be three different columns.'],
    });
  });
});

describe('toUploadOptions with a time layout', () => {
  it('sends a chosen layout, and the pattern only with the custom layout', () => {
    const setup = { ...guessUploadSetup(WIDE, ';', ['air_t', 'rh'], 'Europe/Berlin'), timeFormat: 'day-first-dot' as const, timePattern: 'ignored' };
    const dayFirst = toUploadOptions(setup, WIDE);
    expect(dayFirst.ok && dayFirst.options).toMatchObject({ timeFormat: 'day-first-dot', timeZone: 'Europe/Berlin' });
    expect(dayFirst.ok && dayFirst.options.timePattern).toBeUndefined();
    const custom = toUploadOptions({ ...setup, timeFormat: 'pattern', timePattern: 'dd.MM.yy HH:mm' }, WIDE);
    expect(custom.ok && custom.options).toMatchObject({ timeFormat: 'pattern', timePattern: 'dd.MM.yy HH:mm' });
  });

  it('refuses the custom layout without a pattern, and a wall-clock layout without a zone, with the server schema’s messages', () => {
    const setup = guessUploadSetup(WIDE, ',', ['air_t', 'rh'], '');
    expect(toUploadOptions({ ...setup, timeFormat: 'pattern', timeZone: 'UTC' }, WIDE)).toEqual({
      ok: false,
      problems: ['Pattern of the times: give the pattern of the time column, e.g. dd.MM.yyyy HH:mm.'],
    });
    expect(toUploadOptions({ ...setup, timeFormat: 'month-first-slash' }, WIDE)).toEqual({
      ok: false,
      problems: ["Time zone of the times: these times carry no offset from UTC: name the zone they are in (usually the logger's own)."],
    });
  });
});
