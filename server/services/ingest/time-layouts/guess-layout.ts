import { BUILT_IN_LAYOUTS, LAYOUT_LABELS, parseWithLayout, type BuiltInLayout } from '../time-layouts.ts';

/**
 * When guessing, a layout only counts as reading a row if the instant lies in 1980–2099: a
 * ten-digit epoch-seconds value read as milliseconds lands in January 1970, and a serial day
 * number read as epoch seconds lands on 1 January 1970, so without this window every number
 * would be "read" by three layouts. An upload may still name any layout explicitly.
 */
const PLAUSIBLE_FROM = Date.UTC(1980, 0, 1);
const PLAUSIBLE_UNTIL = Date.UTC(2100, 0, 1);

export interface AmbiguousRow {
  /** 1-based position in the samples. */
  row: number;
  text: string;
  readings: { layout: BuiltInLayout; ts: number }[];
}

export interface LayoutGuess {
  /** Built-in layouts that read every non-blank sample to a plausible instant. */
  candidates: BuiltInLayout[];
  /** The layout to use, or null when none fits or the candidates disagree on some row. */
  chosen: BuiltInLayout | null;
  /** Rows the candidates read to different instants (e.g. 03/04/2026: 3 April or 4 March). */
  ambiguousRows: AmbiguousRow[];
  /** Why nothing was chosen, as `ts: reason` naming rows and the layout that would read most. */
  reason?: string;
}

/** "rows 1–3, 5" from sorted 1-based row numbers. */
export function rowList(rows: number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < rows.length; i++) {
    let j = i;
    while (j + 1 < rows.length && rows[j + 1] === rows[j] + 1) j++;
    parts.push(j > i ? `${rows[i]}–${rows[j]}` : `${rows[i]}`);
    i = j;
  }
  return `${rows.length === 1 ? 'row' : 'rows'} ${parts.join(', ')}`;
}

/**
 * Guesses the time layout of an upload from its first rows' time texts: every built-in layout
 * is tried on every non-blank sample (in `timeZone`, UTC if not given), the ones that read all
 * of them are the candidates, and one is chosen only if the candidates agree on every row —
 * 03/04/2026 alone is ambiguous, a sample with a day above 12 settles it. When nothing reads
 * every row the reason names the first row no layout reads (or says no single layout reads all)
 * and which layout would read the most rows.
 */
export function guessLayout(samples: string[], timeZone = 'UTC'): LayoutGuess {
  const rows = samples.map((text, i) => ({ row: i + 1, text: String(text ?? '').trim() })).filter((r) => r.text !== '');
  if (rows.length === 0) return { candidates: [], chosen: null, ambiguousRows: [], reason: 'ts: no sample rows to guess the layout from' };
  const readings = new Map<BuiltInLayout, (number | null)[]>();
  for (const layout of BUILT_IN_LAYOUTS) {
    readings.set(
      layout,
      rows.map((r) => {
        const p = parseWithLayout(r.text, layout, timeZone);
        return p.ok && p.ts >= PLAUSIBLE_FROM && p.ts < PLAUSIBLE_UNTIL ? p.ts : null;
      }),
    );
  }
  const candidates = BUILT_IN_LAYOUTS.filter((l) => readings.get(l)!.every((ts) => ts !== null));
  if (candidates.length === 0) return { candidates, chosen: null, ambiguousRows: [], reason: noLayoutReason(rows, readings) };
  const ambiguousRows: AmbiguousRow[] = [];
  rows.forEach((r, k) => {
    const found = candidates.map((layout) => ({ layout, ts: readings.get(layout)![k]! }));
    if (new Set(found.map((f) => f.ts)).size > 1) ambiguousRows.push({ row: r.row, text: r.text, readings: found });
  });
  if (ambiguousRows.length === 0) return { candidates, chosen: candidates[0], ambiguousRows };
  const names = candidates.map((l) => LAYOUT_LABELS[l]).join(' or ');
  return {
    candidates,
    chosen: null,
    ambiguousRows,
    reason: `ts: ${rowList(ambiguousRows.map((a) => a.row))} read as different times with ${names}; choose the layout`,
  };
}

function noLayoutReason(rows: { row: number; text: string }[], readings: Map<BuiltInLayout, (number | null)[]>): string {
  const unread = rows.find((_, k) => BUILT_IN_LAYOUTS.every((l) => readings.get(l)![k] === null));
  let best: BuiltInLayout | null = null;
  let bestRows: number[] = [];
  for (const layout of BUILT_IN_LAYOUTS) {
    const read = rows.filter((_, k) => readings.get(layout)![k] !== null).map((r) => r.row);
    if (read.length > bestRows.length) [best, bestRows] = [layout, read];
  }
  const head = unread ? `ts: no layout reads row ${unread.row} ("${unread.text.slice(0, 40)}")` : 'ts: no single layout reads every sample row';
  return best ? `${head}; ${LAYOUT_LABELS[best]} would read ${rowList(bestRows)}` : `${head}; no layout reads any of them`;
}
