import { describe, expect, it } from 'vitest';
import { createNdjsonReader } from './ndjson-reader.ts';

// NDJSON: one JSON text per line, lines separated by "\n" ("\r\n" tolerated) — the format of
// the upload answer (API contract: progress lines, then a summary or error line).
const ANSWER =
  '{"type":"progress","lines":2500,"readings":5000,"accepted":5000,"duplicates":0,"quarantined":0}\n' +
  '{"type":"summary","lines":3000,"readings":6000,"accepted":5999,"duplicates":0,"quarantined":1,"firstQuarantined":[{"index":4321,"code":"bad_value","reason":"value: must be a finite number","line":2162}]}\n';

describe('createNdjsonReader', () => {
  it('yields the same values however the text is cut into pieces', () => {
    const whole = createNdjsonReader().push(ANSWER);
    expect(whole.map((v) => (v as { type: string }).type)).toEqual(['progress', 'summary']);

    const reader = createNdjsonReader();
    const byChar = [...ANSWER].flatMap((c) => reader.push(c));
    expect(byChar).toEqual(whole);
    expect(reader.end()).toEqual([]);
  });

  it('keeps a line cut across pieces until its newline, and reads a last line with no newline at the end', () => {
    const reader = createNdjsonReader();
    expect(reader.push('{"type":"progr')).toEqual([]);
    expect(reader.push('ess","lines":1}\r\n{"type":"sum')).toEqual([{ type: 'progress', lines: 1 }]);
    expect(reader.push('mary","lines":2}')).toEqual([]);
    expect(reader.end()).toEqual([{ type: 'summary', lines: 2 }]);
  });

  it('skips blank and damaged lines and counts the damaged ones', () => {
    const reader = createNdjsonReader();
    expect(reader.push('\n{not json\n{"type":"error","code":"x","message":"y"}\n\n')).toEqual([{ type: 'error', code: 'x', message: 'y' }]);
    expect(reader.skipped).toBe(1);
  });
});
