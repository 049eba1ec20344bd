import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseReadingValue } from './parse-reading-value.ts';

// Limits of IEEE 754 binary64 (IEEE 754-2019 §3.3): largest finite ≈ 1.7976931348623157e308,
// smallest normal 2^−1022 ≈ 2.2250738585072014e-308, smallest subnormal 2^−1074 ≈ 4.9e-324.
describe('parseReadingValue', () => {
  it.each([
    ['21.5', 21.5],
    [' -0.25 ', -0.25],
    ['1e3', 1000],
    ['.5', 0.5],
    ['0', 0],
    ['0.000', 0],
    ['0e-400', 0], // zero written as zero is no underflow
    ['2.2250738585072014e-308', 2.2250738585072014e-308],
    ['1.7976931348623157e308', 1.7976931348623157e308],
  ])('reads %j', (raw, value) => {
    expect(parseReadingValue(raw)).toEqual({ ok: true, value });
  });

  it.each([
    ['1e-400', 'value: "1e-400" is too small for a double (below 2.2e-308 it would lose digits or become 0)'],
    ['-3.5e-330', 'value: "-3.5e-330" is too small for a double (below 2.2e-308 it would lose digits or become 0)'],
    ['4.9e-324', 'value: "4.9e-324" is too small for a double (below 2.2e-308 it would lose digits or become 0)'],
    ['1e309', 'value: "1e309" is too large for a double (beyond ±1.8e308)'],
    ['abc', 'value: must be a finite number'],
    ['0x10', 'value: must be a finite number'],
    ['', 'value: must be a finite number'],
  ])('refuses %j', (raw, reason) => {
    expect(parseReadingValue(raw)).toEqual({ ok: false, reason });
  });

  it('takes finite JSON numbers as they are and refuses the rest', () => {
    expect(parseReadingValue(-7.25)).toEqual({ ok: true, value: -7.25 });
    expect(parseReadingValue(Number.NaN).ok).toBe(false);
    expect(parseReadingValue(null).ok).toBe(false);
    expect(parseReadingValue(true).ok).toBe(false);
  });

  it('reads back every normal double written in shortest form (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true, noDefaultInfinity: true }).filter((x) => x === 0 || Math.abs(x) >= 2.2250738585072014e-308),
        (x) => {
          const r = parseReadingValue(String(x));
          expect(r).toEqual({ ok: true, value: x === 0 ? 0 : x }); // String(-0) is "0"
        },
      ),
    );
  });
});
