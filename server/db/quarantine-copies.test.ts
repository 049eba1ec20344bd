import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCopies, storedCopies } from './quarantine-copies.ts';

describe('storedCopies / readCopies', () => {
  it('keeps a JSON item’s time and value once, in raw', () => {
    const raw = JSON.stringify({ channel: 'air_t', ts: 'yesterday', value: 21.5 });
    const kept = storedCopies(raw, 'yesterday', '21.5');
    expect(kept).toEqual({ raw, tsRaw: null, valueRaw: null, copiedFields: 15 | (15 << 4) });
    expect(readCopies(kept)).toEqual({ tsRaw: 'yesterday', valueRaw: '21.5' });
  });

  it('keeps a time that was read (ISO 8601 UTC, not the text sent) in its own column', () => {
    const raw = 'air_t,2026-11-01 10:00,over';
    const kept = storedCopies(raw, '2026-11-01T10:00:00.000Z', 'over');
    expect(kept).toEqual({ raw, tsRaw: '2026-11-01T10:00:00.000Z', valueRaw: null, copiedFields: 3 << 4 });
    expect(readCopies(kept)).toEqual({ tsRaw: '2026-11-01T10:00:00.000Z', valueRaw: 'over' });
  });

  it('takes CSV fields by position, whatever the header order', () => {
    const kept = storedCopies('12.5,air_t,32/13/2026', '32/13/2026', '12.5');
    expect(kept.copiedFields).toBe(3 | (1 << 4));
    expect(readCopies(kept)).toEqual({ tsRaw: '32/13/2026', valueRaw: '12.5' });
  });

  it('keeps a field its own column when raw does not give it back exactly (a quoted comma, truncation, no raw)', () => {
    expect(storedCopies('air_t,1,2,5', '1', '2,5')).toMatchObject({ tsRaw: null, valueRaw: '2,5' });
    expect(storedCopies(null, 'x', 'y')).toEqual({ raw: null, tsRaw: 'x', valueRaw: 'y', copiedFields: 0 });
    expect(storedCopies('{"ts": 1', '1', null)).toEqual({ raw: '{"ts": 1', tsRaw: '1', valueRaw: null, copiedFields: 0 });
  });

  it('keeps null as null, and JSON values that are not strings as their JSON text', () => {
    const raw = JSON.stringify({ channel: 'rh', ts: [1, 2], value: null });
    const kept = storedCopies(raw, '[1,2]', null);
    expect(kept).toMatchObject({ tsRaw: null, valueRaw: null, copiedFields: 15 });
    expect(readCopies(kept)).toEqual({ tsRaw: '[1,2]', valueRaw: null });
  });

  it('reads back exactly what was given, for any text (property)', () => {
    const field = fc.oneof(fc.constant(null), fc.string({ maxLength: 12 }), fc.constantFrom('1', '21.5', 'n/a', ''));
    const jsonRaw = fc
      .record({ ts: fc.oneof(fc.string(), fc.double(), fc.constant(null)), value: fc.oneof(fc.string(), fc.double(), fc.constant(null)) })
      .map((o) => JSON.stringify(o));
    const csvRaw = fc.array(fc.string({ maxLength: 6 }), { maxLength: 16 }).map((f) => f.join(','));
    fc.assert(
      fc.property(fc.oneof(fc.constant(null), jsonRaw, csvRaw, fc.string()), field, field, (raw, ts, value) => {
        expect(readCopies(storedCopies(raw, ts, value))).toEqual({ tsRaw: ts, valueRaw: value });
      }),
      { numRuns: 2000 },
    );
  });

  it('reads back a field taken from a CSV line or a JSON item exactly (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ maxLength: 6 }), { minLength: 1, maxLength: 20 }), fc.nat(), fc.nat(), (fields, i, j) => {
        const raw = fields.join(',');
        const ts = raw.split(',')[i % fields.length];
        const value = raw.split(',')[j % fields.length];
        const kept = storedCopies(raw, ts, value);
        expect(readCopies(kept)).toEqual({ tsRaw: ts, valueRaw: value });
      }),
      { numRuns: 2000 },
    );
    fc.assert(
      fc.property(fc.jsonValue(), fc.jsonValue(), (ts, value) => {
        const raw = JSON.stringify({ channel: 'air_t', ts, value });
        const asText = (v: unknown) => (v === null ? null : typeof v === 'string' ? v : JSON.stringify(v));
        const item = JSON.parse(raw) as { ts: unknown; value: unknown };
        const kept = storedCopies(raw, asText(item.ts), asText(item.value));
        if (item.ts !== null) expect(kept.tsRaw).toBeNull();
        expect(readCopies(kept)).toEqual({ tsRaw: asText(item.ts), valueRaw: asText(item.value) });
      }),
      { numRuns: 1000 },
    );
  });
});
