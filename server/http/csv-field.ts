/**
 * The one place Lagbook turns values into CSV text: every CSV the server writes (quarantine
 * export, readings export, diagnostics) goes through `csvLine`, so no writer can forget the
 * formula guard.
 */

/**
 * Leading characters a spreadsheet reads as the start of a formula or a control character
 * (OWASP, "CSV Injection": `=`, `+`, `-`, `@`, tab, carriage return).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/** A plain decimal number as text ("-3.2", "+4", "1e-3"): a spreadsheet reads it as a number, never a formula. */
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * A text cell made safe to open in a spreadsheet: text starting with a formula character gets
 * a leading apostrophe (OWASP "CSV Injection" guidance), so `=HYPERLINK(…)` shows as text
 * instead of running. Text that is just a plain number ("-3.2", as a logger sent it) is left
 * alone, since the apostrophe would turn a harmless number into text.
 */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/**
 * One CSV field per RFC 4180: numbers written as numbers; text neutralised against formula
 * injection (see `neutraliseFormula`) and quoted when it holds a comma, quote or line break.
 */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number' || typeof value === 'bigint') return String(value);
  const s = neutraliseFormula(String(value));
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** One CSV line (CRLF-terminated, RFC 4180 §2). */
export function csvLine(values: unknown[]): string {
  return `${values.map(csvField).join(',')}\r\n`;
}
