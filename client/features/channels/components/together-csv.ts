import { zoneOffsetMinutes, formatZoned } from '../../../components/clock/format.ts';
import { aggregationOf, plottedPoints, type DrawnLine } from './together-chart-option.ts';

/*
 * The formula guard of `server/http/csv-field.ts`, copied because the client may import only
 * `server/contract/` and `server/policies/` (the boundary check): a text cell starting with
 * `=`, `+`, `-`, `@`, tab or carriage return gets a leading apostrophe (OWASP "CSV Injection"),
 * unless it is a plain number. Keep the two in step; the unit test runs the same cases.
 */
const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** One CSV field per RFC 4180, numbers as numbers, text guarded against formula injection and quoted when needed. */
export function csvField(value: string | number | null): string {
  if (value === null) return '';
  if (typeof value === 'number') return String(value);
  const s = FORMULA_START.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV line, CRLF-terminated (RFC 4180 §2). */
export function csvLine(values: ReadonlyArray<string | number | null>): string {
  return `${values.map(csvField).join(',')}\r\n`;
}

/** An instant as ISO 8601 on the clock of `zone` with its offset (`2026-11-24T01:00:00+01:00`; ms only when not whole seconds). */
export function zonedIso(ms: number, zone: string): string {
  const off = zoneOffsetMinutes(ms, zone);
  const a = Math.abs(off);
  const offset = `${off < 0 ? '-' : '+'}${String(Math.floor(a / 60)).padStart(2, '0')}:${String(a % 60).padStart(2, '0')}`;
  const frac = ms % 1000 !== 0 ? `.${String(((ms % 1000) + 1000) % 1000).padStart(3, '0')}` : '';
  return `${formatZoned(ms, zone, { seconds: true }).replace(' ', 'T')}${frac}${offset}`;
}

/**
 * The table behind the CSV export: one row per instant at which at least one line draws a
 * value (ascending), the time on the shown zone's clock and in UTC, then one column per line
 * (its value there, or empty). Built from `plottedPoints`, the same points the chart draws, so
 * the file holds exactly what is shown: same channels, range and aggregation (each header
 * names logger, channel, unit and aggregation). Gap markers draw nothing and make no row.
 */
export function togetherCsvTable(lines: readonly DrawnLine[], zone: string): { header: string[]; rows: Array<Array<string | number | null>> } {
  const byTime = new Map<number, Array<number | null>>();
  lines.forEach((l, col) => {
    for (const [t, v] of plottedPoints(l.series)) {
      if (v === null) continue;
      let row = byTime.get(t);
      if (!row) byTime.set(t, (row = new Array<number | null>(lines.length).fill(null)));
      row[col] = v;
    }
  });
  const times = [...byTime.keys()].sort((a, b) => a - b);
  return {
    header: [`time on the clock of ${zone}`, 'time in UTC', ...lines.map((l) => `${l.name} · ${aggregationOf(l.series)}`)],
    rows: times.map((t) => [zonedIso(t, zone), new Date(t).toISOString(), ...byTime.get(t)!]),
  };
}

/** The CSV text of {@link togetherCsvTable}. */
export function togetherCsv(lines: readonly DrawnLine[], zone: string): string {
  const { header, rows } = togetherCsvTable(lines, zone);
  return csvLine(header) + rows.map(csvLine).join('');
}
