import type { Note } from '@shared/contract/notes.ts';

/** A note as the readings chart shades it: its span and its words. */
export interface NoteChartSpan {
  from: number;
  to: number;
  label: string;
  excluded: boolean;
}

/**
 * The spans of `notes` to shade on a chart: kind and text as the label, "left out" said
 * where the note is marked "leave out of analysis", "whole logger" where it is on every channel.
 */
export function noteSpans(notes: readonly Note[]): NoteChartSpan[] {
  return notes.map((n) => ({
    from: n.from,
    to: n.to,
    label: `${n.kind.name}${n.channelId === null ? ' (whole logger)' : ''}${n.excludeFromAnalysis ? ', left out' : ''}: ${n.text}`,
    excluded: n.excludeFromAnalysis,
  }));
}

/** How a note's span reads on the logger's clock, e.g. "2026-11-24 09:00 – 11:30". */
export function spanWords(from: number, to: number, format: (ms: number) => string): string {
  const a = format(from);
  const b = format(to);
  const [dayA] = a.split(' ');
  const [dayB, ...timeB] = b.split(' ');
  return dayA === dayB ? `${a} – ${timeB.join(' ')}` : `${a} – ${b}`;
}
