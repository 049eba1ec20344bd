import { describe, expect, it } from 'vitest';
import { formatNumber, formatReading, readingDecimals, roughRatio } from './alert-numbers.ts';

/**
 * Expected texts follow common practice for printed numbers: fixed decimals by rounding half
 * away from zero as `Number.prototype.toFixed` does on the stored double, en-GB digit grouping,
 * and a space between number and unit (BIPM SI Brochure, 9th ed. 2019, §5.4.3).
 */
describe('readingDecimals', () => {
  const cases: Array<[string, number[], number | null]> = [
    ['no readings', [], null],
    ['whole numbers', [12, -3, 0], 0],
    ['the most decimals among the readings', [16.9, 40.1, 12.25], 2],
    ['float noise of a sum is not a decimal', [0.1 + 0.2], 1],
    ['tiny values count their leading zeros', [0.000125], 6],
    ['capped at six', [1.23456789], 6],
    ['negative values', [-7.125], 3],
    ['huge values', [1.5e21], 0],
  ];
  for (const [name, values, decimals] of cases) it(name, () => expect(readingDecimals(values)).toBe(decimals));
});

describe('formatNumber and formatReading', () => {
  const cases: Array<[string, number, number | null, string, string]> = [
    ['the channel resolution', 40.1, 1, '°C', '40.1 °C'],
    ['rounds a derived value to the resolution', 16.9437, 1, '°C', '16.9 °C'],
    ['keeps trailing zeros the resolution asks for', 16, 1, '°C', '16.0 °C'],
    ['negative', -15.25, 2, '°C', '-15.25 °C'],
    ['a negative that rounds to zero is 0', -0.04, 1, '°C', '0.0 °C'],
    ['integers', 412, 0, 'ppm', '412 ppm'],
    ['thousands grouped', 1013.25, 2, 'hPa', '1,013.25 hPa'],
    ['percent with a space', 45, 0, '%', '45 %'],
    ['no unit', 3.5, 1, '', '3.5'],
    ['unknown resolution: 3 significant digits', 49.2775, null, '', '49.3'],
    ['unknown resolution, negative', -0.0123456, null, '°C', '-0.0123 °C'],
    ['unknown resolution, integer', 7, null, 'ppm', '7 ppm'],
    ['unknown resolution, large', 123456, null, 'ppm', '123,000 ppm'],
    ['unknown resolution, huge', 1.5e21, null, 'Pa', '1.5 × 10²¹ Pa'],
    ['unknown resolution, tiny', 0.0000123456, null, 'mol/L', '1.23 × 10⁻⁵ mol/L'],
    ['unknown resolution, tiny negative', -2.5e-9, null, '', '-2.5 × 10⁻⁹'],
    ['unknown resolution, zero', 0, null, '°C', '0 °C'],
  ];
  for (const [name, v, decimals, unit, text] of cases) it(name, () => expect(formatReading(v, unit, decimals)).toBe(text));

  it('names what is not a finite number', () => {
    expect(formatNumber(Number.NaN, 1)).toBe('not a number');
    expect(formatNumber(-Infinity, null)).toBe('minus infinity');
  });
});

describe('roughRatio', () => {
  it('two significant digits, as people say a multiple', () => {
    expect([roughRatio(49.2775), roughRatio(5.43), roughRatio(123.4), roughRatio(Infinity)]).toEqual(['49', '5.4', '120', 'infinitely many']);
  });
});
