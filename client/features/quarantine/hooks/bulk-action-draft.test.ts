import { describe, expect, it } from 'vitest';
import { bulkActionFromDraft, EMPTY_DRAFT, offsetText } from './bulk-action-draft.ts';

// Problems are said with the field's label from the shared quarantine words (server/contract/words/quarantine.ts), never its key.
describe('bulkActionFromDraft', () => {
  it('re-reads with a layout, in the logger zone unless one is chosen; a pattern only with its text', () => {
    expect(bulkActionFromDraft(EMPTY_DRAFT)).toEqual({ action: { kind: 'reread', timeFormat: 'day-first-dot' } });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, timeFormat: 'pattern', timePattern: 'dd.MM.yyyy HH:mm', timeZone: 'Europe/Berlin' })).toEqual({
      action: { kind: 'reread', timeFormat: 'pattern', timePattern: 'dd.MM.yyyy HH:mm', timeZone: 'Europe/Berlin' },
    });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, timeFormat: 'pattern' })).toEqual({ error: 'Pattern of the times: must not be empty.' });
  });

  it('turns sign, hours and minutes into signed minutes, refusing 0 and bad numbers', () => {
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'shift', sign: '-', hours: '1', minutes: '30' })).toEqual({
      action: { kind: 'shift', offsetMinutes: -90 },
    });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'shift', sign: '+', hours: '', minutes: '45' })).toEqual({
      action: { kind: 'shift', offsetMinutes: 45 },
    });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'shift', hours: '0', minutes: '0' })).toEqual({
      error: 'Shift (minutes): must not be 0 (a shift of nothing changes nothing).',
    });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'shift', hours: 'one' })).toEqual({ error: 'Hours: must be a whole number.' });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'shift', minutes: '75' })).toEqual({ error: 'Minutes: must be a whole number from 0 to 59.' });
  });

  it('needs a channel to map to, and a reason to discard', () => {
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'map-channel' })).toEqual({ error: 'Choose the channel these rows belong to.' });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'map-channel', channelId: '31' })).toEqual({ action: { kind: 'map-channel', channelId: 31 } });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'discard', reason: ' ' })).toEqual({ error: 'Why they are discarded: say why, in a few words.' });
    expect(bulkActionFromDraft({ ...EMPTY_DRAFT, kind: 'discard', reason: 'probe in the wrong pot' })).toEqual({
      action: { kind: 'discard', reason: 'probe in the wrong pot' },
    });
  });
});

describe('offsetText', () => {
  it('says a signed offset in hours and minutes', () => {
    expect(offsetText(-90)).toBe('−1 h 30 min');
    expect(offsetText(60)).toBe('+1 h');
    expect(offsetText(45)).toBe('+45 min');
  });
});
