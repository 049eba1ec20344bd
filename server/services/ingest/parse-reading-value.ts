/** Result of reading one value field: a finite double, or why it could not be read. */
export type ValueParse = { ok: true; value: number } | { ok: false; reason: string };

const STRICT_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NONZERO_DIGIT = /[1-9]/;
/** The smallest positive normal double, 2^−1022 (IEEE 754-2019 §3.3, binary64 emin = −1022). */
const MIN_NORMAL = 2.2250738585072014e-308;

/**
 * Reads a reading's value: a finite JSON number, or text in plain decimal or exponent notation.
 * Text whose magnitude a double cannot hold is refused rather than silently changed: beyond
 * ±1.8e308 it would become ±Infinity, and below 2^−1022 it underflows to 0 or to a subnormal
 * that has lost digits ("1e-400" would be stored as 0). Zero written as zero stays 0.
 */
export function parseReadingValue(raw: unknown): ValueParse {
  if (typeof raw === 'number') return Number.isFinite(raw) ? { ok: true, value: raw } : { ok: false, reason: 'value: must be a finite number' };
  if (typeof raw !== 'string') return { ok: false, reason: 'value: must be a finite number' };
  const s = raw.trim();
  if (!STRICT_NUMBER.test(s)) return { ok: false, reason: 'value: must be a finite number' };
  const n = Number(s);
  if (!Number.isFinite(n)) return { ok: false, reason: `value: "${s.slice(0, 40)}" is too large for a double (beyond ±1.8e308)` };
  if (Math.abs(n) < MIN_NORMAL) {
    const mantissa = s.replace(/[eE].*$/, '');
    if (NONZERO_DIGIT.test(mantissa))
      return { ok: false, reason: `value: "${s.slice(0, 40)}" is too small for a double (below 2.2e-308 it would lose digits or become 0)` };
  }
  return { ok: true, value: n };
}
