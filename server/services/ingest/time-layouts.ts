import { TIME_LAYOUT_LABELS, TIME_LAYOUTS, type TimeLayoutId } from '../../contract/uploads.ts';
import { parseReadingTime, type TimeParse } from './parse-reading-time.ts';
import { compilePattern, readWithPattern, type CompiledPattern, type WallFields } from './time-layouts/pattern.ts';
import { serialToNaiveMs } from './time-layouts/serial-day.ts';
import { instantOfWallClock, naiveUtcMs } from './wall-clock-instant.ts';

export { compilePattern, type CompiledPattern } from './time-layouts/pattern.ts';

/** The built-in time layouts an upload may name (the list is vocabulary of the uploads contract). */
export const BUILT_IN_LAYOUTS = TIME_LAYOUTS;

export type BuiltInLayout = TimeLayoutId;

/** A layout: a built-in one, or a custom pattern compiled once with `compilePattern`. */
export type TimeLayout = BuiltInLayout | { custom: CompiledPattern };

/** The LDML-subset patterns behind the day/month layouts: with seconds first, then without. */
const LAYOUT_PATTERNS: Partial<Record<BuiltInLayout, string[]>> = {
  'day-first-dot': ['d.M.yyyy H:mm:ss', 'd.M.yyyy H:mm'],
  'day-first-slash': ['d/M/yyyy H:mm:ss', 'd/M/yyyy H:mm'],
  'month-first-slash': ['M/d/yyyy H:mm:ss', 'M/d/yyyy H:mm'],
  'day-first-slash-12h': ['d/M/yyyy h:mm:ss a', 'd/M/yyyy h:mm a'],
  'month-first-slash-12h': ['M/d/yyyy h:mm:ss a', 'M/d/yyyy h:mm a'],
};

/** Short human descriptions, for messages and the upload form. */
export const LAYOUT_LABELS = TIME_LAYOUT_LABELS;

const compiled = new Map<string, CompiledPattern>();
function builtInPattern(pattern: string): CompiledPattern {
  let c = compiled.get(pattern);
  if (!c) {
    const result = compilePattern(pattern);
    if ('error' in result) throw new Error(`built-in layout pattern ${pattern}: ${result.error}`);
    c = result;
    compiled.set(pattern, c);
  }
  return c;
}

const bad = (reason: string): TimeParse => ({ ok: false, reason, code: 'bad_time' });

/** The instant of a wall clock (naive UTC ms) in a zone, refusing a time skipped by a daylight-saving change. */
function inZone(naiveMs: number, text: string, timeZone: string): TimeParse {
  const ts = instantOfWallClock(naiveMs, timeZone);
  if (ts === null) return bad(`ts: "${text.slice(0, 40)}" does not exist in ${timeZone} (daylight-saving change)`);
  return { ok: true, ts };
}

function readPatterns(text: string, patterns: CompiledPattern[], timeZone: string): TimeParse {
  let firstError = '';
  for (const p of patterns) {
    const w: WallFields | { error: string } = readWithPattern(text, p);
    if ('error' in w) {
      // a text of the right shape with a bad field says so; otherwise report the first shape tried
      if (!w.error.includes('does not match')) return bad(w.error);
      firstError ||= w.error;
      continue;
    }
    return inZone(naiveUtcMs(w.y, w.mo, w.d, w.h, w.mi, w.s, w.ms), text, timeZone);
  }
  return bad(firstError);
}

/**
 * Reads one time field with a chosen layout, in the logger's IANA zone for layouts without an
 * offset (all but ISO-with-offset and the epoch ones). Wall times skipped by a daylight-saving
 * change are refused and a repeated hour takes its first occurrence (`instantOfWallClock`).
 * ISO 8601 with an offset and epoch times go through `parseReadingTime`, so their checks
 * (valid offsets, ±8.64e15 ms range) and messages are the ingest ones.
 */
export function parseWithLayout(text: string, layout: TimeLayout, timeZone: string): TimeParse {
  if (typeof text !== 'string' || text.trim() === '') return bad('ts: missing');
  const s = text.trim();
  if (typeof layout === 'object') return readPatterns(s, [layout.custom], timeZone);
  switch (layout) {
    case 'epoch-s':
    case 'epoch-ms':
      return parseReadingTime(s, { format: layout });
    case 'iso': {
      // read as a local time first (the text plus "Z" is a valid ISO time only if it had no offset)
      const asLocal = parseReadingTime(`${s}Z`, { format: 'iso' });
      if (asLocal.ok) return inZone(asLocal.ts, s, timeZone);
      return parseReadingTime(s, { format: 'iso', timeZone });
    }
    case 'serial-1900': {
      const r = serialToNaiveMs(s);
      if ('error' in r) return { ok: false, reason: r.error, code: r.outOfRange ? 'time_out_of_range' : 'bad_time' };
      return inZone(r.naiveMs, s, timeZone);
    }
    default: {
      const patterns = LAYOUT_PATTERNS[layout];
      if (!patterns) return bad(`layout: "${String(layout)}" is not a known layout (use one of ${BUILT_IN_LAYOUTS.join(', ')} or a custom pattern)`);
      return readPatterns(s, patterns.map(builtInPattern), timeZone);
    }
  }
}
