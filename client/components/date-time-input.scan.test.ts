import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const CLIENT = join(__dirname, '..');

/** Every non-test source file of the client (tests may name a picker to check it is absent). */
function sources(dir = CLIENT): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return /\.tsx?$/.test(name) && !/\.test\.tsx?$/.test(name) ? [path] : [];
  });
}

// The browser's own date and time pickers follow the browser's language (a US browser shows
// 12-hour times and month/day/year), so Lagbook uses its DateTimeInput / DateInput instead.
// As a JSX attribute (`type="time"`) any of them; in an object (`{ type: 'date' }`, props spread
// onto an input) all but `time`, which is also the name of an ECharts time axis.
const BROWSER_PICKER = /type\s*=\s*\{?\s*['"](datetime-local|date|time|month|week)['"]|type\s*:\s*['"](datetime-local|date|month|week)['"]/g;

/** Each place in `text` that asks for a browser date or time picker, as `line: match`. */
export function browserPickers(text: string): string[] {
  return [...text.matchAll(BROWSER_PICKER)].map((m) => `${text.slice(0, m.index).split('\n').length}: ${m[0]}`);
}

describe('no browser date or time pickers in the client', () => {
  it('finds the forms a picker can be asked for (so the scan below can fail)', () => {
    expect(browserPickers('<input type="datetime-local" />')).toEqual(['1: type="datetime-local"']);
    expect(browserPickers("x\n<TextField type='date' />")).toEqual(["2: type='date'"]);
    expect(browserPickers('<input type={"time"} />')).toEqual(['1: type={"time"']);
    expect(browserPickers("{ type: 'datetime-local' }")).toEqual(["1: type: 'datetime-local'"]);
    // an ECharts time axis is not a picker
    expect(browserPickers("xAxis: { type: 'time' }")).toEqual([]);
    expect(browserPickers('<input type="text" inputMode="numeric" />')).toEqual([]);
  });

  it('no client file asks for one', () => {
    const found = sources().flatMap((path) => browserPickers(readFileSync(path, 'utf8')).map((hit) => `${relative(CLIENT, path)}:${hit}`));
    expect(found).toEqual([]);
  });
});
