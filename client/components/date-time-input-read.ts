/**
 * Reading what a person typed into Lagbook's date-time input: a date `YYYY-MM-DD` and a time
 * `HH:MM` on the 24-hour clock of a named zone, held together as `YYYY-MM-DDTHH:mm` (the string
 * the forms keep). Every refusal and notice is written for the person at the logger, in one
 * catalogue below so the wording is reviewed in one place.
 */
import { formatOffset, formatZoned } from './clock/format.ts';
import { instantAtWallClock } from './date-time-input-wall-clock.ts';

/** Every message the date-time input can show. */
export const DATE_TIME_MESSAGES = {
  dateMissing: 'Give a date.',
  dateShape: 'Write the date as year-month-day, for example 2026-12-03.',
  notADate: (date: string) => `${date} is not a date.`,
  timeMissing: 'Give a time.',
  timeShape: 'Write the time on the 24-hour clock as hours:minutes, for example 14:00.',
  notATime: (time: string) => `${time} is not a time of day: hours run from 00 to 23 and minutes from 00 to 59.`,
  skipped: (time: string, date: string, zone: string, jump: string, used: string) =>
    `${time} does not happen on ${date} in ${zone}: the clock skips ${jump} that night. ${used} will be used.`,
  repeated: (time: string, date: string, zone: string, offset: string) =>
    `${time} happens twice on ${date} in ${zone} (the clock goes back that night); the first one, at ${offset}, is used.`,
  rangeOrder: 'The last day must be on or after the first day.',
} as const;

/** What a typed date-time means: the instant, or why it cannot be read. */
export type DateTimeReading = { ok: true; ms: number; notice: string | null } | { ok: false; problem: string; part: 'date' | 'time' };

/** The date and time parts of a form's `YYYY-MM-DDTHH:mm` string (either may be empty). */
export function splitDateTime(value: string): { date: string; time: string } {
  const at = value.indexOf('T');
  return at < 0 ? { date: value, time: '' } : { date: value.slice(0, at), time: value.slice(at + 1) };
}

/**
 * A typed date: `YYYY-MM-DD` on the Gregorian calendar (ISO 8601 calendar date, extended
 * format), or why not. `2026-02-30` is refused rather than rolled over into March.
 */
export function readDate(text: string): { ok: true; y: number; m: number; d: number } | { ok: false; problem: string } {
  const t = text.trim();
  if (t === '') return { ok: false, problem: DATE_TIME_MESSAGES.dateMissing };
  const m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t);
  if (!m) return { ok: false, problem: DATE_TIME_MESSAGES.dateShape };
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const probe = new Date(Date.UTC(y, mo - 1, d));
  if (mo < 1 || mo > 12 || d < 1 || probe.getUTCMonth() !== mo - 1 || probe.getUTCDate() !== d) return { ok: false, problem: DATE_TIME_MESSAGES.notADate(t) };
  return { ok: true, y, m: mo, d };
}

/** A typed time on the 24-hour clock: `14:00`, `9:05` or `1400`, or why not. */
export function readTime(text: string): { ok: true; h: number; min: number } | { ok: false; problem: string } {
  const t = text.trim();
  if (t === '') return { ok: false, problem: DATE_TIME_MESSAGES.timeMissing };
  const m = /^(\d{1,2}):?(\d{2})$/.exec(t);
  if (!m) return { ok: false, problem: DATE_TIME_MESSAGES.timeShape };
  const [h, min] = [Number(m[1]), Number(m[2])];
  if (h > 23 || min > 59) return { ok: false, problem: DATE_TIME_MESSAGES.notATime(t) };
  return { ok: true, h, min };
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** A date as `YYYY-MM-DD`. */
export const dateText = (y: number, m: number, d: number) => `${pad(y, 4)}-${pad(m)}-${pad(d)}`;

/** A time as `HH:MM`. */
export const timeText = (h: number, min: number) => `${pad(h)}:${pad(min)}`;

/** An amount of clock change in words: "an hour", "30 minutes". */
const jumpWords = (minutes: number) => (minutes === 60 ? 'an hour' : minutes % 60 === 0 ? `${minutes / 60} hours` : `${minutes} minutes`);

/**
 * The instant a typed `YYYY-MM-DDTHH:mm` names on the clock of `timeZone`, with a notice when the
 * time is skipped (the clocks go forward; the time after the jump is used) or repeated (the clocks
 * go back; the first one is used) that day — see {@link instantAtWallClock} — or the refusal of
 * the part that cannot be read.
 */
export function readDateTime(value: string, timeZone: string): DateTimeReading {
  const { date, time } = splitDateTime(value);
  const d = readDate(date);
  if (!d.ok) return { ok: false, problem: d.problem, part: 'date' };
  const t = readTime(time);
  if (!t.ok) return { ok: false, problem: t.problem, part: 'time' };
  const wall = Date.UTC(d.y, d.m - 1, d.d, t.h, t.min);
  const at = instantAtWallClock(wall, timeZone);
  const [day, clock] = [dateText(d.y, d.m, d.d), timeText(t.h, t.min)];
  let notice: string | null = null;
  if (at.skipped) {
    const used = formatZoned(at.ms, timeZone);
    const jump = Math.round((Date.parse(`${used.replace(' ', 'T')}:00Z`) - wall) / 60_000);
    notice = DATE_TIME_MESSAGES.skipped(clock, day, timeZone, jumpWords(jump), used.startsWith(day) ? used.slice(11) : used);
  } else if (at.repeated) {
    notice = DATE_TIME_MESSAGES.repeated(clock, day, timeZone, formatOffset(Math.round((wall - at.ms) / 60_000)));
  }
  return { ok: true, ms: at.ms, notice };
}

/** A typed day for a day filter: empty (no limit), or `YYYY-MM-DD` of a real date. */
export function readDay(text: string): { ok: true; day: string | null } | { ok: false; problem: string } {
  if (text.trim() === '') return { ok: true, day: null };
  const d = readDate(text);
  return d.ok ? { ok: true, day: dateText(d.y, d.m, d.d) } : d;
}
