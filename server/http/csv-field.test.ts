import { describe, expect, it } from 'vitest';
import { csvField, csvLine, neutraliseFormula } from './csv-field.ts';

// Expected behaviour from OWASP's "CSV Injection" guidance: cells beginning with = + - @ tab or
// carriage return are prefixed with a single quote; RFC 4180 §2 for quoting.
describe('csvField', () => {
  it.each([
    ['=1+1', "'=1+1"],
    ['+1+cmd', "'+1+cmd"],
    ['-3+cmd', "'-3+cmd"],
    ['@SUM(1)', "'@SUM(1)"],
    ['\tnote', "'\tnote"],
  ])('prefixes text starting with a formula character: %j', (text, expected) => {
    expect(csvField(text)).toBe(expected);
  });

  it('prefixes a leading carriage return and then quotes the field (it holds a line break)', () => {
    expect(csvField('\r=cmd')).toBe(`"'\r=cmd"`);
  });

  it('prefixes inside the quotes and doubles embedded quotes', () => {
    expect(csvField('=HYPERLINK("http://x","y")')).toBe(`"'=HYPERLINK(""http://x"",""y"")"`);
  });

  it('writes numbers as numbers, negative ones included', () => {
    expect(csvField(-3.2)).toBe('-3.2');
    expect(csvField(0)).toBe('0');
    expect(csvField(1e-7)).toBe('1e-7');
    expect(csvLine(['x', -3.2, -1])).toBe('x,-3.2,-1\r\n');
  });

  it('leaves text that is a plain number alone (a logger sent "-3.2")', () => {
    expect(csvField('-3.2')).toBe('-3.2');
    expect(csvField('+4')).toBe('+4');
    expect(csvField('-1e-3')).toBe('-1e-3');
    expect(csvField('-')).toBe("'-");
    expect(csvField('-3.2.1')).toBe("'-3.2.1");
  });

  it('leaves ordinary text, empty values and formula characters later in the text alone', () => {
    expect(csvField('air_t')).toBe('air_t');
    expect(csvField('a=b')).toBe('a=b');
    expect(csvField(' =b')).toBe(' =b');
    expect(csvField(null)).toBe('');
    expect(csvField(undefined)).toBe('');
    expect(csvField('')).toBe('');
    expect(csvField('a,b')).toBe('"a,b"');
  });

  it('neutraliseFormula only prefixes', () => {
    expect(neutraliseFormula("=cmd|' /C calc'!A0")).toBe("'=cmd|' /C calc'!A0");
    expect(neutraliseFormula('2026-01-01T00:00:00Z')).toBe('2026-01-01T00:00:00Z');
  });
});
