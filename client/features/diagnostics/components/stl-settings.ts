import type { StlSettings } from '@shared/contract/diagnostics.ts';

/** One STL setting as the page shows it: the paper's symbol, a plain name, the value and what it does. */
export interface StlSettingRow {
  symbol: string;
  name: string;
  value: string;
}

const DEGREE_WORDS = ['local mean', 'local straight line', 'local quadratic'];

/** 2 → "2nd", 3 → "3rd", 11 → "11th", 21 → "21st". */
const ordinal = (n: number) => {
  const teen = n % 100 >= 11 && n % 100 <= 13;
  const end = teen ? 'th' : (({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th');
  return `${n}${end}`;
};

const fitWords = (degree: number, jump: number) =>
  `${DEGREE_WORDS[degree] ?? `local polynomial of degree ${degree}`}, ${jump <= 1 ? 'fitted at every value' : `fitted at every ${ordinal(jump)} value and joined by straight lines between`}`;

/**
 * The STL settings as run, in the order and with the symbols in which Cleveland, Cleveland,
 * McRae & Terpenning (1990), J. Official Statistics 6(1):3–73, §3 introduce them: n(p) cycle
 * length, n(i) inner passes, n(o) robustness passes, n(l) low-pass window, n(t) trend window,
 * n(s) seasonal smoothing window. Each is named in plain words for the page (the API keeps its
 * own field names); the degree and jump of each smoother are said beside its window.
 */
export function stlSettingRows(s: StlSettings): StlSettingRow[] {
  return [
    { symbol: 'n(p)', name: 'Cycle length', value: `${s.period} steps in one cycle of the seasonal pattern` },
    { symbol: 'n(i)', name: 'Inner passes', value: `${s.inner} (each pass refines the seasonal part, then the trend)` },
    {
      symbol: 'n(o)',
      name: 'Robustness passes',
      value: s.outer === 0 ? '0 (every value counts alike)' : `${s.outer} (after each, values far from the fit count for less in the next)`,
    },
    { symbol: 'n(l)', name: 'Low-pass window', value: `${s.lowpassWindow} steps, ${fitWords(s.lowpassDegree, s.lowpassJump)}` },
    { symbol: 'n(t)', name: 'Trend window', value: `${s.trendWindow} steps, ${fitWords(s.trendDegree, s.trendJump)}` },
    {
      symbol: 'n(s)',
      name: 'Seasonal smoothing window',
      value: s.periodic
        ? 'all cycles: the same seasonal shape repeats in every cycle'
        : `${s.seasonalWindow} cycles (each point of the cycle is smoothed across that many neighbouring cycles), ${fitWords(s.seasonalDegree, s.seasonalJump)}`,
    },
  ];
}
