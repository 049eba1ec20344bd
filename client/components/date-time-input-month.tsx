import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';
import { Button } from './button.tsx';
import { dateText, readDate } from './date-time-input-read.ts';

const DAY_MS = 86_400_000;
// ISO 8601 weeks start on Monday
const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

/** `YYYY-MM-DD` of a UTC-midnight instant (calendar arithmetic only; no zone involved). */
const dayOf = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const msOf = (day: string) => Date.parse(`${day}T00:00:00Z`);

/**
 * The weeks of the month holding `day` (`YYYY-MM-DD`), Monday first: each week seven days, the
 * days of the neighbouring months included so every row is whole (ISO 8601 calendar weeks).
 */
export function monthWeeks(day: string): string[][] {
  const first = msOf(`${day.slice(0, 7)}-01`);
  const start = first - ((new Date(first).getUTCDay() + 6) % 7) * DAY_MS;
  const weeks: string[][] = [];
  for (let w = start; weeks.length === 0 || dayOf(w).slice(0, 7) === day.slice(0, 7); w += 7 * DAY_MS) {
    weeks.push(Array.from({ length: 7 }, (_, i) => dayOf(w + i * DAY_MS)));
  }
  return weeks;
}

/** `day` moved by whole months, kept inside the shorter month (2026-01-31 + 1 month → 2026-02-28). */
function addMonths(day: string, months: number): string {
  const [y, m, d] = day.split('-').map(Number);
  const index = y * 12 + (m - 1) + months;
  const [ny, nm] = [Math.floor(index / 12), (index % 12) + 1];
  return dateText(ny, nm, Math.min(d, new Date(Date.UTC(ny, nm, 0)).getUTCDate()));
}

// arrow keys on a day: a day either side, a week up or down; Page Up/Down a month
const MOVES: Record<string, (day: string) => string> = {
  ArrowLeft: (d) => dayOf(msOf(d) - DAY_MS),
  ArrowRight: (d) => dayOf(msOf(d) + DAY_MS),
  ArrowUp: (d) => dayOf(msOf(d) - 7 * DAY_MS),
  ArrowDown: (d) => dayOf(msOf(d) + 7 * DAY_MS),
  PageUp: (d) => addMonths(d, -1),
  PageDown: (d) => addMonths(d, 1),
};

/**
 * A compact month of days to pick one from, for the date fields: the month as `2026-12` between
 * a previous and a next button, a row per week from Monday, each day a button named by its full
 * date. Arrow keys move a day or a week, Page Up/Down a month, Enter or a tap picks, Escape
 * closes. Opens on the typed date (else on `fallback`); the day buttons are 44 px on phones.
 */
export function MonthGrid({
  id,
  label,
  value,
  fallback,
  onPick,
  onClose,
}: {
  id: string;
  label: string;
  value: string;
  fallback: string;
  onPick: (day: string) => void;
  onClose: () => void;
}) {
  const typed = readDate(value);
  const chosen = typed.ok ? dateText(typed.y, typed.m, typed.d) : null;
  const [focused, setFocused] = useState(chosen ?? fallback);
  const grid = useRef<HTMLDivElement>(null);
  const moved = useRef(false);
  useEffect(() => {
    if (moved.current) grid.current?.querySelector<HTMLButtonElement>(`[data-day="${focused}"]`)?.focus();
    moved.current = false;
  }, [focused]);

  function onKey(e: KeyboardEvent<HTMLDivElement>) {
    if (e.key === 'Escape') {
      e.preventDefault();
      return onClose();
    }
    const move = MOVES[e.key];
    if (!move) return;
    e.preventDefault();
    moved.current = true;
    setFocused(move(focused));
  }

  const month = focused.slice(0, 7);
  return (
    <div
      id={id}
      role="group"
      aria-label={`${label}: pick a day`}
      onKeyDown={onKey}
      className="mt-2 w-fit max-w-full rounded-lg border border-rule bg-paper p-2"
    >
      <div className="mb-1 flex items-center justify-between gap-2">
        <Button size="sm" tone="quiet" aria-label="Month before" onClick={() => setFocused(addMonths(focused, -1))}>
          ‹
        </Button>
        <span aria-live="polite" className="font-mono text-sm font-medium tabular-nums">
          {month}
        </span>
        <Button size="sm" tone="quiet" aria-label="Month after" onClick={() => setFocused(addMonths(focused, 1))}>
          ›
        </Button>
      </div>
      <div ref={grid} role="presentation" className="grid grid-cols-7 gap-0.5 text-center font-mono text-sm tabular-nums">
        {WEEKDAYS.map((w) => (
          <span key={w} aria-hidden="true" className="py-1 text-xs text-ink-soft">
            {w}
          </span>
        ))}
        {monthWeeks(focused)
          .flat()
          .map((day) => (
            <button
              key={day}
              type="button"
              data-day={day}
              aria-label={day}
              aria-pressed={day === chosen}
              tabIndex={day === focused ? 0 : -1}
              onClick={() => onPick(day)}
              onFocus={() => setFocused(day)}
              className={`min-h-11 min-w-11 rounded-md sm:min-h-8 sm:min-w-8 ${day.slice(0, 7) === month ? 'text-ink' : 'text-ink-soft'} hover:bg-card aria-pressed:bg-lichen aria-pressed:text-paper`}
            >
              {Number(day.slice(8))}
            </button>
          ))}
      </div>
    </div>
  );
}

/** A small glyph of our own for the month button: a page with a heavier top edge and six day dots. */
function MonthGlyph() {
  return (
    <svg viewBox="0 0 16 16" width="16" height="16" aria-hidden="true" focusable="false" className="fill-current">
      <path d="M2 3h12v11H2z" fill="none" stroke="currentColor" strokeWidth="1.2" />
      <path d="M2 3h12v2.5H2z" />
      {[4.5, 8, 11.5].flatMap((x) => [8.5, 11.5].map((y) => <circle key={`${x}-${y}`} cx={x} cy={y} r="0.9" />))}
    </svg>
  );
}

/**
 * The month button beside a date field and the month it opens: `toggle` goes after the field,
 * `grid` below the row. Picking a day hands it to `onPick` and puts the focus back on the field
 * (`fieldRef`); Escape closes the month the same way.
 */
export function useMonthPicker({
  label,
  date,
  fallback,
  onPick,
  describedBy,
}: {
  label: string;
  date: string;
  fallback: () => string;
  onPick: (day: string) => void;
  /** The id of the field's label, so the button is announced with it. */
  describedBy?: string;
}) {
  const [open, setOpen] = useState(false);
  const fieldRef = useRef<HTMLInputElement>(null);
  const gridId = `${useId()}-month`;
  const close = () => {
    setOpen(false);
    fieldRef.current?.focus();
  };
  const toggle = (
    <Button
      size="sm"
      className="sm:min-h-9"
      aria-label="Pick the day from a month"
      aria-describedby={describedBy}
      aria-expanded={open}
      aria-controls={open ? gridId : undefined}
      onClick={() => setOpen(!open)}
    >
      <MonthGlyph />
    </Button>
  );
  const grid = open ? (
    <MonthGrid
      id={gridId}
      label={label}
      value={date}
      fallback={fallback()}
      onPick={(day) => {
        onPick(day);
        close();
      }}
      onClose={close}
    />
  ) : null;
  return { toggle, grid, fieldRef };
}
