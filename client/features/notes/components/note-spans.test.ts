import { describe, expect, it } from 'vitest';
import type { Note } from '@shared/contract/notes.ts';
import { noteSpans, spanWords } from './note-spans.ts';

const note = (over: Partial<Note>): Note => ({
  id: 1,
  loggerId: 2,
  loggerName: 'Mast A',
  channelId: 3,
  channelLabel: 'Air temperature',
  kind: { id: 4, name: 'maintenance', retired: false },
  text: 'Probe cleaned',
  from: 1000,
  to: 2000,
  excludeFromAnalysis: false,
  createdBy: null,
  createdAt: '2026-11-24T10:00:00.000Z',
  updatedBy: null,
  updatedAt: '2026-11-24T10:00:00.000Z',
  ...over,
});

describe('noteSpans', () => {
  it('labels each span with its kind and text, saying when it is on the whole logger or left out', () => {
    expect(noteSpans([note({}), note({ channelId: null, excludeFromAnalysis: true, text: 'Mast lowered' })])).toEqual([
      { from: 1000, to: 2000, label: 'maintenance: Probe cleaned', excluded: false },
      { from: 1000, to: 2000, label: 'maintenance (whole logger), left out: Mast lowered', excluded: true },
    ]);
  });
});

describe('spanWords', () => {
  const fmt = (ms: number) => (ms < 5 ? '2026-11-24 09:00' : ms < 10 ? '2026-11-24 11:30' : '2026-11-25 08:00');
  it('writes the day once when both ends fall on the same day', () => {
    expect(spanWords(1, 6, fmt)).toBe('2026-11-24 09:00 – 11:30');
    expect(spanWords(1, 20, fmt)).toBe('2026-11-24 09:00 – 2026-11-25 08:00');
  });
});
