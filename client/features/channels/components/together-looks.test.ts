import { describe, expect, it } from 'vitest';
import { TOGETHER_LOOKS } from './together-looks.ts';
import { MAX_TOGETHER } from './together-url.ts';

/** Relative luminance of an sRGB colour, WCAG 2.1 "relative luminance" definition. */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
/** WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05). */
const contrast = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
};

const CARD = '#fffdf8'; // --color-card in client/styles.css

describe('TOGETHER_LOOKS', () => {
  it('has a look for each of the six lines a chart takes', () => {
    expect(TOGETHER_LOOKS).toHaveLength(MAX_TOGETHER);
  });

  it('checks the contrast formula on its published end points (WCAG 2.1: black on white is 21:1)', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 10);
    expect(contrast('#777777', '#ffffff')).toBeCloseTo(4.48, 2); // #777 on white ≈ 4.48:1, a value widely quoted from the formula (from memory)
  });

  it('draws every line with at least 3:1 contrast against the card (WCAG 2.1 SC 1.4.11, graphical objects)', () => {
    for (const look of TOGETHER_LOOKS) expect(contrast(look.color, CARD), look.name).toBeGreaterThanOrEqual(3);
  });

  it('never tells two lines apart by colour alone: dash patterns and symbols differ too', () => {
    expect(new Set(TOGETHER_LOOKS.map((l) => l.color)).size).toBe(6);
    expect(new Set(TOGETHER_LOOKS.map((l) => JSON.stringify(l.dash))).size).toBe(6);
    expect(new Set(TOGETHER_LOOKS.map((l) => l.symbol)).size).toBe(6);
  });
});
