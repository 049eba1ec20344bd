import { identifyProcess } from '../../server/analysis/index.ts';

/** One simulated series with its true orders and what R's auto.arima chose on it. */
export interface IdentificationCase {
  process: string;
  trueP: number;
  trueQ: number;
  n: number;
  seed: number;
  autoArima: { p: number; q: number };
  x: number[];
}

export type ProcessClass = 'white noise' | 'AR' | 'MA' | 'ARMA';

/** The class a (p, q) belongs to. */
export const classOf = (p: number, q: number): ProcessClass => (p === 0 ? (q === 0 ? 'white noise' : 'MA') : q === 0 ? 'AR' : 'ARMA');

export interface ScoreRow {
  process: string;
  n: number;
  series: number;
  classRight: number;
  ordersRight: number;
  autoArimaClassRight: number;
  autoArimaOrdersRight: number;
}

/**
 * Runs `identifyProcess` on every case (no period search: the simulated series have none) and
 * counts, per process and length, how often it names the true class and the exact (p, q), beside
 * the same counts for R's auto.arima. A 'needs-differencing' verdict counts as wrong.
 */
export function scoreIdentification(cases: IdentificationCase[]): ScoreRow[] {
  const rows = new Map<string, ScoreRow>();
  for (const c of cases) {
    const key = `${c.process}|${c.n}`;
    const row = rows.get(key) ?? { process: c.process, n: c.n, series: 0, classRight: 0, ordersRight: 0, autoArimaClassRight: 0, autoArimaOrdersRight: 0 };
    rows.set(key, row);
    const result = identifyProcess(Float64Array.from(c.x), { knownPeriod: null });
    const model = result.verdict === 'needs-differencing' ? null : result.model;
    const truth = classOf(c.trueP, c.trueQ);
    row.series++;
    if (model && classOf(model.p, model.q) === truth) row.classRight++;
    if (model && model.p === c.trueP && model.q === c.trueQ) row.ordersRight++;
    if (classOf(c.autoArima.p, c.autoArima.q) === truth) row.autoArimaClassRight++;
    if (c.autoArima.p === c.trueP && c.autoArima.q === c.trueQ) row.autoArimaOrdersRight++;
  }
  return [...rows.values()];
}

/** Totals over rows. */
export function totals(rows: ScoreRow[]) {
  const sum = (k: keyof ScoreRow) => rows.reduce((s, r) => s + (r[k] as number), 0);
  return {
    series: sum('series'),
    classRight: sum('classRight'),
    ordersRight: sum('ordersRight'),
    autoArimaClassRight: sum('autoArimaClassRight'),
    autoArimaOrdersRight: sum('autoArimaOrdersRight'),
  };
}
