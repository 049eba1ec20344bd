/**
 * Numbers in alert texts, written the way people read them: a reading at the resolution its
 * channel reports, a derived number (a rate, a ratio) to three significant digits, always with
 * the channel's unit. One place for it, so every rule kind, the alert list and the mail agree.
 */

/** The most decimals a channel's resolution is taken to have (a reading's float noise past this is ignored). */
export const MAX_DECIMALS = 6;

/** Decimals of one number as stored: its shortest decimal form, read at 12 significant digits so float noise (0.1 + 0.2) does not count. */
function decimalsOfOne(v: number): number {
  if (!Number.isFinite(v) || Number.isInteger(v)) return 0;
  const text = Math.abs(v).toPrecision(12);
  const [mantissa, exponent = '0'] = text.split('e');
  const fraction = (mantissa.split('.')[1] ?? '').replace(/0+$/, '');
  return Math.max(0, fraction.length - Number(exponent));
}

/**
 * The resolution a channel's readings carry: the most decimals among `values` (the readings a
 * rule looked at), capped at {@link MAX_DECIMALS}; null when there are none (then texts fall
 * back to three significant digits).
 *
 * Cost: O(n).
 */
export function readingDecimals(values: ArrayLike<number>): number | null {
  if (values.length === 0) return null;
  let most = 0;
  for (let i = 0; i < values.length; i++) most = Math.max(most, decimalsOfOne(values[i]));
  return Math.min(most, MAX_DECIMALS);
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** `digits` significant digits; powers of ten for magnitudes a person cannot count at a glance (≥ 10⁹ or < 10⁻⁴). */
function significant(v: number, digits: number): string {
  const size = Math.abs(v);
  if (size !== 0 && (size >= 1e9 || size < 1e-4)) {
    const [mantissa, exponent] = v.toExponential(digits - 1).split('e');
    const power = String(Number(exponent)).replace(/./g, (c) => SUPERSCRIPT[c] ?? c);
    return `${Number(mantissa)} × 10${power}`;
  }
  const text = new Intl.NumberFormat('en-GB', { maximumSignificantDigits: digits }).format(v);
  return text === '-0' ? '0' : text;
}

/**
 * A number for alert texts: with `decimals` (the channel's resolution, {@link readingDecimals})
 * exactly that many decimals; without (null), three significant digits. Thousands are grouped
 * ("1,013.2"); a value that rounds to zero is "0", never "-0".
 */
export function formatNumber(v: number, decimals: number | null): string {
  if (!Number.isFinite(v)) return Number.isNaN(v) ? 'not a number' : v > 0 ? 'infinity' : 'minus infinity';
  if (decimals === null) return significant(v, 3);
  const d = Math.min(Math.max(Math.round(decimals), 0), MAX_DECIMALS);
  const rounded = Number(v.toFixed(d));
  const text = new Intl.NumberFormat('en-GB', { minimumFractionDigits: d, maximumFractionDigits: d }).format(rounded === 0 ? 0 : rounded);
  return text;
}

/**
 * A number with the channel's unit, separated by a space as the SI Brochure asks (BIPM, 9th ed.
 * 2019, §5.4.3, "%" included): "40.1 °C", "45 %", "412 ppm"; the number alone when the channel
 * has no unit.
 */
export function withUnitText(number: string, unit = ''): string {
  return unit.trim() ? `${number} ${unit.trim()}` : number;
}

/** A reading with its unit at the given resolution (see {@link formatNumber}). */
export function formatReading(v: number, unit: string, decimals: number | null): string {
  return withUnitText(formatNumber(v, decimals), unit);
}

/** A ratio read roughly, as people say it: two significant digits ("about 49 times", "about 5.4 times", "about 120 times"). */
export function roughRatio(x: number): string {
  if (!Number.isFinite(x)) return 'infinitely many';
  return significant(x, 2);
}
