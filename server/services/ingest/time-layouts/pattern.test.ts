import { describe, expect, it } from 'vitest';
import { compilePattern, readWithPattern, type CompiledPattern } from './pattern.ts';

// Symbols from UTS #35 Part 4 §8 "Date Field Symbol Table"; only the documented subset is accepted.
const compiled = (p: string): CompiledPattern => {
  const c = compilePattern(p);
  if ('error' in c) throw new Error(c.error);
  return c;
};

describe('compilePattern', () => {
  it.each([['yyyy-MM-dd HH:mm'], ['d.M.yyyy H:mm:ss'], ["yyyy-MM-dd'T'HH:mm:ss.SSS"], ['MM/dd/yy hh:mm a'], ["dd/MM/yyyy HH'h'mm"]])('accepts %s', (p) => {
    expect(compilePattern(p)).not.toHaveProperty('error');
  });

  it.each([
    ['', 'pattern: missing'],
    ['yyyy-MM-dd HH:mm z', 'pattern: "z" at position 18 is not supported'],
    ['yyyy-MMM-dd HH:mm', 'pattern: "MMM" at position 6 is not supported'],
    ['YYYY-MM-dd HH:mm', 'pattern: "YYYY" at position 1 is not supported'],
    ['yyyy-MM-dd HH:mm EEE', 'pattern: "EEE" at position 18 is not supported'],
    ['yyyy-MM-ddTHH:mm', 'pattern: "T" at position 11 is not supported'],
    ["yyyy-MM-dd 'T HH:mm", 'pattern: the quote at position 12 is never closed'],
    ['yyyy-MM-dd', 'pattern: no hour field'],
    ['MM-dd HH:mm', 'pattern: no year field'],
    ['yyyy-MM-dd HH', 'pattern: no minute field'],
    ['yyyy-MM-dd hh:mm', 'pattern: 12-hour "hh" needs an AM/PM field "a"'],
    ['yyyy-MM-dd HH:mm a', 'pattern: "a" (AM/PM) goes with a 12-hour field'],
    ['yyyy-MM-dd HH:mm yy', 'pattern: "yy" at position 18 repeats the year already given by "yyyy"'],
    ['yyyy-MM-dd HH:mm:ss:ss', 'pattern: "ss" at position 21 repeats the second'],
  ])('refuses %j', (p, reason) => {
    const c = compilePattern(p);
    expect(c).toHaveProperty('error');
    expect('error' in c ? c.error : '').toContain(reason);
  });

  it('refuses an over-long pattern', () => {
    expect(compilePattern(`yyyy-MM-dd HH:mm${' '.repeat(100)}`)).toEqual({ error: 'pattern: longer than 100 characters' });
  });
});

describe('readWithPattern', () => {
  it('reads every field, treating regex characters in literals literally', () => {
    expect(readWithPattern('(2026) 07|04 3:05:09.007 PM', compiled('(yyyy) MM|dd h:mm:ss.SSS a'))).toEqual({
      y: 2026,
      mo: 7,
      d: 4,
      h: 15,
      mi: 5,
      s: 9,
      ms: 7,
    });
    expect(readWithPattern('2026x07x04 00:00', compiled('yyyy.MM.dd HH:mm'))).toHaveProperty('error');
  });

  it('reads yy as 2000–2099 and 12 AM as midnight, 12 PM as noon (common practice)', () => {
    expect(readWithPattern('31/12/99 12:00 am', compiled('dd/MM/yy hh:mm a'))).toMatchObject({ y: 2099, mo: 12, d: 31, h: 0 });
    expect(readWithPattern('31/12/00 12:00 PM', compiled('dd/MM/yy hh:mm a'))).toMatchObject({ y: 2000, h: 12 });
  });

  it('knows leap years of the Gregorian calendar', () => {
    expect(readWithPattern('29.02.2024 00:00', compiled('dd.MM.yyyy HH:mm'))).toMatchObject({ d: 29, mo: 2 });
    expect(readWithPattern('29.02.2100 00:00', compiled('dd.MM.yyyy HH:mm'))).toEqual({ error: 'ts: "29.02.2100 00:00": day 29 is not in 2100-02' });
  });

  it('needs exactly two digits for dd and MM', () => {
    expect(readWithPattern('1.02.2026 00:00', compiled('dd.MM.yyyy HH:mm'))).toHaveProperty('error');
    expect(readWithPattern('1.2.2026 00:00', compiled('d.M.yyyy HH:mm'))).toMatchObject({ d: 1, mo: 2 });
  });
});
