import { useId, useLayoutEffect, useRef, useState, type ChangeEvent, type KeyboardEvent } from 'react';
import { formatZoned, zoneCaption } from './clock/format.ts';
import { useMonthPicker } from './date-time-input-month.tsx';
import { dateText, readDate, readDateTime, readDay, readTime, splitDateTime, timeText } from './date-time-input-read.ts';

// 24-hour, ISO-like text fields of Lagbook's own: never the browser's date pickers, whose format
// follows the browser's language (a US browser shows 12-hour times and month/day/year).
// Touch targets are 44 px tall on phones (min-h-11 below the sm breakpoint).
const PART =
  'min-h-11 sm:min-h-9 rounded-md border border-rule bg-card px-2 py-1 font-mono text-ink tabular-nums aria-[invalid=true]:border-alert focus:border-lichen';

type Segment = { from: number; to: number };
// the parts an arrow key steps, by caret position: year, month, day / hours, minutes
const DATE_SEGMENTS: Segment[] = [
  { from: 0, to: 4 },
  { from: 5, to: 7 },
  { from: 8, to: 10 },
];
const TIME_SEGMENTS: Segment[] = [
  { from: 0, to: 2 },
  { from: 3, to: 5 },
];
const segmentAt = (segments: Segment[], caret: number) =>
  Math.max(
    0,
    segments.findIndex((s) => caret <= s.to),
  );

/** `date` moved by one year, month or day (`segment` 0, 1, 2); a month or year step keeps the day inside the month. */
export function stepDate(date: string, segment: number, by: 1 | -1): string | null {
  const d = readDate(date);
  if (!d.ok) return null;
  if (segment === 2) {
    const moved = new Date(Date.UTC(d.y, d.m - 1, d.d + by));
    return dateText(moved.getUTCFullYear(), moved.getUTCMonth() + 1, moved.getUTCDate());
  }
  const months = d.y * 12 + (d.m - 1) + (segment === 0 ? 12 : 1) * by;
  const [y, m] = [Math.floor(months / 12), (months % 12) + 1];
  const lastDay = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return dateText(y, m, Math.min(d.d, lastDay));
}

/** `time` moved by one hour or minute (`segment` 0, 1), going round the clock face (23:00 → 00:00). */
export function stepTime(time: string, segment: number, by: 1 | -1): string | null {
  const t = readTime(time);
  if (!t.ok) return null;
  return segment === 0 ? timeText((t.h + 24 + by) % 24, t.min) : timeText(t.h, (t.min + 60 + by) % 60);
}

/** Arrow up/down on a focused part: step the part under the caret and keep the caret there. */
function useArrowSteps(segments: Segment[], step: (text: string, segment: number, by: 1 | -1) => string | null, onText: (text: string) => void) {
  const caret = useRef<{ el: HTMLInputElement; segment: Segment } | null>(null);
  useLayoutEffect(() => {
    if (caret.current) caret.current.el.setSelectionRange(caret.current.segment.from, caret.current.segment.to);
    caret.current = null;
  });
  return (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key !== 'ArrowUp' && e.key !== 'ArrowDown') return;
    const el = e.currentTarget;
    const index = segmentAt(segments, el.selectionStart ?? 0);
    const next = step(el.value, index, e.key === 'ArrowUp' ? 1 : -1);
    if (next === null) return;
    e.preventDefault();
    caret.current = { el, segment: segments[index] };
    onText(next);
  };
}

/** Only the characters a date (digits and '-') or time (digits and ':') can hold. */
const keep = (allowed: RegExp) => (e: ChangeEvent<HTMLInputElement>) => e.target.value.replace(allowed, '').slice(0, 10);

/**
 * Lagbook's input for a wall-clock date and time on the clock of `timeZone` (IANA name): a date
 * field (`2026-12-03`) and a 24-hour time field (`14:00`), the zone named beside them with its
 * offset on that day. Takes and gives the forms' `YYYY-MM-DDTHH:mm` string (as `toZonedInput`
 * writes it); the caller reads it with `readDateTime`, which says the same as this control
 * does. Arrow up/down steps the year, month, day, hour or minute under the caret. An impossible
 * date or time is named once the person leaves the field; a time the clock skips or repeats on
 * a daylight-saving day is explained with the time that will be used.
 */
export function DateTimeInput({
  label,
  value,
  onChange,
  timeZone,
  error,
  hint,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  timeZone: string;
  /** The caller's own refusal of this field (shown instead of the control's). */
  error?: string;
  hint?: string;
}) {
  const id = useId();
  const [touched, setTouched] = useState(false);
  const { date, time } = splitDateTime(value);
  const reading = readDateTime(value, timeZone);
  const problem = error ?? (touched && !reading.ok ? reading.problem : undefined);
  const badPart = error ? null : !reading.ok && touched ? reading.part : null;
  const notice = reading.ok ? reading.notice : null;
  const zone = zoneCaption(reading.ok ? reading.ms : Date.now(), timeZone);
  const describedBy = [`${id}-zone`, hint ? `${id}-hint` : null, problem ? `${id}-error` : null, notice ? `${id}-notice` : null].filter(Boolean).join(' ');
  const setDate = (d: string) => onChange(`${d}T${time}`);
  const setTime = (t: string) => onChange(`${date}T${t}`);
  const onDateKey = useArrowSteps(DATE_SEGMENTS, stepDate, setDate);
  const onTimeKey = useArrowSteps(TIME_SEGMENTS, stepTime, setTime);
  // the month opens on today as the zone's clock reads it when no date is typed yet
  const month = useMonthPicker({ label, date, describedBy: `${id}-legend`, fallback: () => formatZoned(Date.now(), timeZone).slice(0, 10), onPick: setDate });
  // a time typed as 9:05 or 1400 is written back as 09:05 / 14:00 when the field is left
  const tidyTime = () => {
    const t = readTime(time);
    if (t.ok && timeText(t.h, t.min) !== time) setTime(timeText(t.h, t.min));
  };

  return (
    <fieldset className="min-w-0" aria-describedby={describedBy}>
      <legend id={`${id}-legend`} className="text-sm font-medium">
        {label}
      </legend>
      <div className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-1">
        <span className="inline-flex items-center gap-1">
          <input
            ref={month.fieldRef}
            aria-label={`${label} date`}
            aria-invalid={error !== undefined || badPart === 'date' || undefined}
            inputMode="numeric"
            autoComplete="off"
            spellCheck={false}
            placeholder="YYYY-MM-DD"
            value={date}
            onChange={(e) => setDate(keep(/[^\d-]/g)(e))}
            onKeyDown={onDateKey}
            onBlur={() => setTouched(true)}
            className={`${PART} w-[8.75rem]`}
          />
          {month.toggle}
          <input
            aria-label={`${label} time`}
            aria-invalid={error !== undefined || badPart === 'time' || undefined}
            inputMode="numeric"
            autoComplete="off"
            spellCheck={false}
            placeholder="HH:MM"
            value={time}
            onChange={(e) => setTime(keep(/[^\d:]/g)(e).slice(0, 5))}
            onKeyDown={onTimeKey}
            onBlur={() => {
              setTouched(true);
              tidyTime();
            }}
            className={`${PART} w-[4.75rem]`}
          />
        </span>
        <span id={`${id}-zone`} className="text-xs text-ink-soft">
          {zone}
        </span>
      </div>
      {month.grid}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {notice && (
        <p id={`${id}-notice`} className="mt-1 text-xs text-ink">
          {notice}
        </p>
      )}
      {problem && (
        <p id={`${id}-error`} className="mt-1 text-sm text-alert">
          {problem}
        </p>
      )}
    </fieldset>
  );
}

/** Today's date on the browser's clock, where the day filters count their days. */
function todayHere(): string {
  const now = new Date();
  return dateText(now.getFullYear(), now.getMonth() + 1, now.getDate());
}

/**
 * The date-only variant for day filters: one `YYYY-MM-DD` field (empty means no limit), arrow
 * up/down stepping the year, month or day under the caret, an impossible date named once the
 * person leaves the field.
 */
export function DateInput({
  label,
  value,
  onChange,
  error,
  hint,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  error?: string;
  hint?: string;
}) {
  const id = useId();
  const [touched, setTouched] = useState(false);
  const reading = readDay(value);
  const problem = error ?? (touched && !reading.ok ? reading.problem : undefined);
  const onKey = useArrowSteps(DATE_SEGMENTS, stepDate, onChange);
  const month = useMonthPicker({ label, date: value, fallback: todayHere, onPick: onChange, describedBy: `${id}-label` });
  const describedBy = [hint ? `${id}-hint` : null, problem ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <div className="min-w-0">
      <label id={`${id}-label`} htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <span className="mt-1 flex items-center gap-1">
        <input
          ref={month.fieldRef}
          id={id}
          aria-invalid={problem ? true : undefined}
          aria-describedby={describedBy || undefined}
          inputMode="numeric"
          autoComplete="off"
          spellCheck={false}
          placeholder="YYYY-MM-DD"
          value={value}
          onChange={(e) => onChange(keep(/[^\d-]/g)(e))}
          onKeyDown={onKey}
          onBlur={() => setTouched(true)}
          className={`${PART} w-[8.75rem]`}
        />
        {month.toggle}
      </span>
      {month.grid}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-soft">
          {hint}
        </p>
      )}
      {problem && (
        <p id={`${id}-error`} className="mt-1 text-sm text-alert">
          {problem}
        </p>
      )}
    </div>
  );
}
