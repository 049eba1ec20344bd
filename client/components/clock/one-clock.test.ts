import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * One clock for the whole app (issue #19 item 1): every time a person reads is written by
 * client/components/clock/ (formatInstant, <Instant>). This scan fails, naming file and line,
 * when another client file formats a time on its own.
 */
const CLIENT = join(__dirname, '..', '..');

/** Files that may handle times themselves: the clock folder, and the date-time input and chart time axis (built on the clock's primitives by their own work). */
const OWNERS = [/^components\/clock\//, /^components\/date-time-input[^/]*$/, /^components\/charts\/time-axis\.ts$/];

/**
 * Machine formats, not display: each entry is a file, the text its line holds, and why it is fine.
 * Keep this short; a new entry needs a reason a reviewer accepts.
 */
const ALLOWED: Array<{ file: string; line: RegExp; why: string }> = [
  { file: 'features/audit/hooks/audit-search-params.ts', line: /toISOString\(\)/, why: 'sends the day filter to the API as ISO 8601, never shown' },
  {
    file: 'features/audit/hooks/audit-search-params.ts',
    line: /get(FullYear|Month|Date)\(\)/,
    why: 'checks that a typed YYYY-MM-DD day exists (calendar arithmetic, not display)',
  },
  { file: 'features/loggers/components/ingest-example.ts', line: /toISOString\(\)/, why: 'the JSON body a logger sends: the ingest format (ISO 8601 UTC)' },
  {
    file: 'features/loggers/components/setup-guide-panel.tsx',
    line: /toISOString\(\)/,
    why: 'shows the wire format loggers must send (ISO 8601 with Z), an example of a format, not a time to read',
  },
  { file: 'features/channels/components/together-csv.ts', line: /toISOString\(\)/, why: 'the CSV file’s UTC column (ISO 8601), a file format' },
];

const DATE_GETTERS = 'FullYear|Month|Date|Day|Hours|Minutes|Seconds|Milliseconds|Year|TimezoneOffset';
/** A time formatted outside the clock: each with the words the failure names. */
const OWN_FORMATTING: Array<[RegExp, string]> = [
  [/Intl\.DateTimeFormat/, 'Intl.DateTimeFormat'],
  [/Intl\.RelativeTimeFormat/, 'Intl.RelativeTimeFormat'],
  [/\.toLocale(Date|Time)String\(/, 'toLocaleDateString / toLocaleTimeString'],
  [/new Date\([^)]*\)\.toLocaleString\(|\.toLocaleString\([^)]*\b(hour|minute|month|day|weekday|timeZone|dateStyle|timeStyle)\b/, 'toLocaleString on a date'],
  [/\.toUTCString\(|\.toDateString\(|\.toTimeString\(/, 'toUTCString / toDateString / toTimeString'],
  [/\.toISOString\(\)/, '.toISOString() shown to a person'],
  [new RegExp(`\\.get(UTC)?(${DATE_GETTERS})\\(\\)`), 'a Date getter (wall clock of the browser or UTC)'],
];

/** Each own time formatting in `text` of the client file `file`, as `file:line: what`. */
export function ownTimeFormatting(file: string, text: string): string[] {
  const hits: string[] = [];
  text.split('\n').forEach((line, i) => {
    if (/^\s*(\/\/|\*|\/\*)/.test(line)) return; // comments may name what not to do
    for (const [pattern, what] of OWN_FORMATTING) {
      if (!pattern.test(line)) continue;
      if (ALLOWED.some((a) => a.file === file && a.line.test(line))) continue;
      hits.push(`${file}:${i + 1}: ${what}`);
    }
  });
  return hits;
}

function sources(dir = CLIENT): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name === 'node_modules' ? [] : sources(path);
    return /\.tsx?$/.test(name) && !/\.(test|testkit)\.tsx?$/.test(name) ? [path] : []; // tests and test-only check values are not pages
  });
}

describe('one clock: no page formats a time on its own', () => {
  it('finds each kind of own formatting (so the scan below can fail)', () => {
    const page = 'features/x/page.tsx';
    expect(ownTimeFormatting(page, 'const f = new Intl.DateTimeFormat(undefined, { timeStyle: "short" });')).toEqual([`${page}:1: Intl.DateTimeFormat`]);
    expect(ownTimeFormatting(page, 'x\n{d.toLocaleTimeString()}')).toEqual([`${page}:2: toLocaleDateString / toLocaleTimeString`]);
    expect(ownTimeFormatting(page, '{new Date(ms).toLocaleString()}')).toEqual([`${page}:1: toLocaleString on a date`]);
    expect(ownTimeFormatting(page, "d.toLocaleString('en', { hour: '2-digit' })")).toEqual([`${page}:1: toLocaleString on a date`]);
    expect(ownTimeFormatting(page, '{new Date(ms).toISOString().slice(0, 10)}')).toEqual([`${page}:1: .toISOString() shown to a person`]);
    expect(ownTimeFormatting(page, '{d.toUTCString()}')).toEqual([`${page}:1: toUTCString / toDateString / toTimeString`]);
    expect(ownTimeFormatting(page, 'const h = d.getHours();')).toEqual([`${page}:1: a Date getter (wall clock of the browser or UTC)`]);
    expect(ownTimeFormatting(page, 'const h = d.getUTCDate();')).toEqual([`${page}:1: a Date getter (wall clock of the browser or UTC)`]);
    expect(ownTimeFormatting(page, 'new Intl.RelativeTimeFormat("en")')).toEqual([`${page}:1: Intl.RelativeTimeFormat`]);
  });

  it('lets numbers be grouped, comments speak, and the allowed machine formats through', () => {
    const page = 'features/x/page.tsx';
    expect(ownTimeFormatting(page, "{n.toLocaleString('en')} rows")).toEqual([]);
    expect(ownTimeFormatting(page, "{v.toLocaleString('en', { maximumFractionDigits: 4 })}")).toEqual([]);
    expect(ownTimeFormatting(page, '// never d.getHours(): the browser’s clock')).toEqual([]);
    expect(ownTimeFormatting('features/loggers/components/ingest-example.ts', 'ts: at.toISOString()')).toEqual([]);
    // an allowance is for its file only
    expect(ownTimeFormatting(page, 'ts: at.toISOString()')).toHaveLength(1);
  });

  it('no client file outside the clock formats a time itself', () => {
    const found = sources().flatMap((path) => {
      const file = relative(CLIENT, path).split('\\').join('/');
      if (OWNERS.some((o) => o.test(file))) return [];
      return ownTimeFormatting(file, readFileSync(path, 'utf8'));
    });
    expect(found).toEqual([]);
  });

  it('every allowance still matches a line (stale entries are removed)', () => {
    for (const a of ALLOWED) {
      const lines = readFileSync(join(CLIENT, a.file), 'utf8').split('\n');
      expect(
        lines.some((l) => a.line.test(l)),
        `${a.file}: ${a.why}`,
      ).toBe(true);
    }
  });
});
