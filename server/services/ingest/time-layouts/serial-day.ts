/**
 * Spreadsheet serial day numbers in the 1900 date system. Source: ECMA-376 1st edition (2006),
 * Part 4 §3.17.4.1 "Date Representation" (checked in a stored copy of that page); in later
 * editions / ISO/IEC 29500 it is Part 1 §18.17.4.1, the "1900 backward compatibility date-base
 * system" (that numbering from memory and a WG4 mailing-list quote). Serial 1 is 1900-01-01
 * and the system keeps the historical mistake of treating 1900 as a leap year, so serial 60 is
 * the non-existent 1900-02-29 and serial 61 is 1900-03-01. The fraction is the time of day. The largest date the system holds
 * is 9999-12-31 (serial 2958465). Serials carry no time zone: they are a wall clock.
 */

const DAY_MS = 86_400_000;
export const MAX_SERIAL = 2_958_466; // exclusive: 9999-12-31 plus its whole day
const SERIAL = /^\d+(?:\.\d+)?$/;

/** 1899-12-31 and 1899-12-30 as naive UTC ms: the day before serial 1, and the base once past the phantom day. */
const BEFORE_SERIAL_1 = Date.UTC(1899, 11, 31);
const BASE_AFTER_PHANTOM = Date.UTC(1899, 11, 30);

/**
 * The wall clock (as naive UTC ms) of a 1900-system serial day number, or why it is refused:
 * not a plain non-negative number, below 1, the phantom day 60, or beyond 9999-12-31.
 * The time of day is rounded to the millisecond.
 */
export function serialToNaiveMs(text: string): { naiveMs: number } | { error: string; outOfRange?: true } {
  const shown = `"${text.slice(0, 40)}"`;
  if (!SERIAL.test(text)) return { error: `ts: ${shown} is not a serial day number (digits with an optional decimal point)` };
  const serial = Number(text);
  if (serial < 1) return { error: `ts: ${shown}: serial day numbers start at 1 (1900-01-01)` };
  if (serial >= MAX_SERIAL) return { error: `ts: ${shown}: serial day numbers end at 2958465 (9999-12-31)`, outOfRange: true };
  const day = Math.floor(serial);
  if (day === 60) return { error: `ts: ${shown}: serial 60 is 1900-02-29, a day that never existed (the 1900 system's leap-year mistake)` };
  const base = day < 60 ? BEFORE_SERIAL_1 : BASE_AFTER_PHANTOM;
  return { naiveMs: base + day * DAY_MS + Math.round((serial - day) * DAY_MS) };
}
