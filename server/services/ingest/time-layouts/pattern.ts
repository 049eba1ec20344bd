/**
 * Custom time patterns in a documented SUBSET of the Unicode LDML date field symbols
 * (UTS #35 Part 4 "Dates", §8 "Date Field Symbol Table"):
 *   yyyy four-digit year · yy two-digit year, read as 2000–2099 · MM / M month (2 digits / 1–2)
 *   dd / d day · HH / H hour 0–23 · hh / h hour 1–12 (needs `a`) · mm minute · ss second
 *   SSS milliseconds (3 digits) · a AM/PM marker (either case)
 *   'text' a quoted literal, '' a single quote; any other character that is not a letter is literal.
 * Every other letter is refused, so a pattern never silently means something else.
 */

/** The wall-clock fields a pattern reads: year, month, day, hour, minute, second, millisecond. */
export type WallFields = Record<'y' | 'mo' | 'd' | 'h' | 'mi' | 's' | 'ms', number>;

type Field = 'yyyy' | 'yy' | 'MM' | 'M' | 'dd' | 'd' | 'HH' | 'H' | 'hh' | 'h' | 'mm' | 'ss' | 'SSS' | 'a';

const FIELD_REGEX: Record<Field, string> = {
  yyyy: '(\\d{4})',
  yy: '(\\d{2})',
  MM: '(\\d{2})',
  M: '(\\d{1,2})',
  dd: '(\\d{2})',
  d: '(\\d{1,2})',
  HH: '(\\d{2})',
  H: '(\\d{1,2})',
  hh: '(\\d{2})',
  h: '(\\d{1,2})',
  mm: '(\\d{2})',
  ss: '(\\d{2})',
  SSS: '(\\d{3})',
  a: '([AaPp][Mm])',
};

/** What each field sets; two fields setting the same thing (e.g. `yyyy` and `yy`) is refused. */
const SETS: Record<Field, string> = {
  yyyy: 'year',
  yy: 'year',
  MM: 'month',
  M: 'month',
  dd: 'day',
  d: 'day',
  HH: 'hour',
  H: 'hour',
  hh: 'hour',
  h: 'hour',
  mm: 'minute',
  ss: 'second',
  SSS: 'millisecond',
  a: 'AM/PM',
};

export const SUPPORTED_SYMBOLS = 'yyyy, yy, MM, M, dd, d, HH, H, hh, h, mm, ss, SSS, a and quoted literals';

/** A pattern checked once and turned into a matcher. */
export interface CompiledPattern {
  pattern: string;
  regex: RegExp;
  fields: Field[];
}

const escapeLiteral = (text: string) => text.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&').replace(/\s+/g, '\\s+');

/**
 * Checks a custom pattern once (LDML subset above) and compiles it to a matcher; or returns
 * why it is refused as `pattern: reason`, naming the position and the fix. A pattern must
 * give a year, month, day, hour and minute; 12-hour fields need `a` and 24-hour ones refuse it.
 */
export function compilePattern(pattern: string): CompiledPattern | { error: string } {
  if (typeof pattern !== 'string' || pattern.trim() === '') return { error: 'pattern: missing' };
  if (pattern.length > 100) return { error: 'pattern: longer than 100 characters' };
  const fields: Field[] = [];
  const seen = new Map<string, Field>();
  let source = '';
  let i = 0;
  while (i < pattern.length) {
    const c = pattern[i];
    if (c === "'") {
      if (pattern[i + 1] === "'") {
        source += "'";
        i += 2;
        continue;
      }
      // a quoted literal runs to the next lone quote; '' inside it is a quote (UTS #35 §8)
      let literal = '';
      let j = i + 1;
      for (;;) {
        if (j >= pattern.length) return { error: `pattern: the quote at position ${i + 1} is never closed (close it with ')` };
        if (pattern[j] !== "'") literal += pattern[j++];
        else if (pattern[j + 1] === "'") {
          literal += "'";
          j += 2;
        } else break;
      }
      source += escapeLiteral(literal);
      i = j + 1;
      continue;
    }
    if (!/[A-Za-z]/.test(c)) {
      source += escapeLiteral(c);
      i += 1;
      continue;
    }
    let j = i;
    while (pattern[j] === c) j += 1;
    const run = pattern.slice(i, j);
    if (!(run in FIELD_REGEX)) {
      return {
        error: `pattern: "${run}" at position ${i + 1} is not supported (use ${SUPPORTED_SYMBOLS}; quote literal letters as 'T')`,
      };
    }
    const field = run as Field;
    const sets = SETS[field];
    const earlier = seen.get(sets);
    if (earlier) return { error: `pattern: "${run}" at position ${i + 1} repeats the ${sets} already given by "${earlier}"` };
    seen.set(sets, field);
    fields.push(field);
    source += FIELD_REGEX[field];
    i = j;
  }
  for (const needed of ['year', 'month', 'day', 'hour', 'minute']) {
    if (!seen.has(needed)) return { error: `pattern: no ${needed} field (use ${SUPPORTED_SYMBOLS})` };
  }
  const hour = seen.get('hour');
  const twelve = hour === 'hh' || hour === 'h';
  if (twelve && !seen.has('AM/PM')) return { error: `pattern: 12-hour "${hour}" needs an AM/PM field "a" (or use HH for 0–23)` };
  if (!twelve && seen.has('AM/PM')) return { error: `pattern: "a" (AM/PM) goes with a 12-hour field "hh" or "h", not "${hour}"` };
  return { pattern, regex: new RegExp(`^${source}$`), fields };
}

/** Days in a month of the proleptic Gregorian calendar. */
function daysIn(year: number, month: number): number {
  const date = new Date(Date.UTC(2000, month, 0));
  date.setUTCFullYear(year, month, 0);
  return date.getUTCDate();
}

/**
 * Reads the wall-clock fields of `text` with a compiled pattern; or why not, as `ts: reason`
 * (the text does not have the pattern's shape, or a field is out of its range).
 */
export function readWithPattern(text: string, compiled: CompiledPattern): WallFields | { error: string } {
  const shown = `"${text.slice(0, 40)}"`;
  const m = compiled.regex.exec(text);
  if (!m) return { error: `ts: ${shown} does not match the pattern ${compiled.pattern}` };
  const w: WallFields = { y: NaN, mo: NaN, d: NaN, h: NaN, mi: NaN, s: 0, ms: 0 };
  let pm: boolean | null = null;
  compiled.fields.forEach((field, k) => {
    const v = m[k + 1];
    const n = Number(v);
    if (field === 'yyyy') w.y = n;
    else if (field === 'yy') w.y = 2000 + n;
    else if (field === 'MM' || field === 'M') w.mo = n;
    else if (field === 'dd' || field === 'd') w.d = n;
    else if (field === 'HH' || field === 'H' || field === 'hh' || field === 'h') w.h = n;
    else if (field === 'mm') w.mi = n;
    else if (field === 'ss') w.s = n;
    else if (field === 'SSS') w.ms = n;
    else pm = v.toUpperCase() === 'PM';
  });
  if (w.mo < 1 || w.mo > 12) return { error: `ts: ${shown}: month ${w.mo} is not 1–12` };
  if (w.d < 1 || w.d > daysIn(w.y, w.mo)) return { error: `ts: ${shown}: day ${w.d} is not in ${w.y}-${String(w.mo).padStart(2, '0')}` };
  if (pm !== null) {
    if (w.h < 1 || w.h > 12) return { error: `ts: ${shown}: hour ${w.h} is not 1–12 on a 12-hour clock` };
    w.h = (w.h % 12) + (pm ? 12 : 0);
  } else if (w.h > 23) return { error: `ts: ${shown}: hour ${w.h} is not 0–23` };
  if (w.mi > 59) return { error: `ts: ${shown}: minute ${w.mi} is not 0–59` };
  if (w.s > 59) return { error: `ts: ${shown}: second ${w.s} is not 0–59` };
  return w;
}
