/**
 * Process identification on simulated ARMA series of known order (R 4.2.2 `arima.sim`, seeds in
 * the fixture; written by tests/reference/identification.R), against the truth and against what
 * R's `forecast::auto.arima(x, d = 0, seasonal = FALSE)` chose on the same series. Targets of the
 * product: the right class (white noise / AR / MA / ARMA) in ≥ 85 % and the exact (p, q) in
 * ≥ 80 % of all series, and per process never fewer right than auto.arima.
 * `npm run bench:analysis` runs the same scoring on more series, generated fresh in R.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { scoreIdentification, totals, type IdentificationCase, type ScoreRow } from './identification-scoring.ts';

const fixture = JSON.parse(readFileSync(new URL('./fixtures/identification-r.json', import.meta.url), 'utf8')) as { cases: IdentificationCase[] };

describe('identifyProcess on simulated ARMA series (R arima.sim; reference: forecast::auto.arima)', () => {
  let rows: ScoreRow[] = [];
  beforeAll(() => {
    rows = scoreIdentification(fixture.cases);
  }, 900_000);
  const groups = [...new Map(fixture.cases.map((c) => [`${c.process}|${c.n}`, { process: c.process, n: c.n }])).values()];

  it(`names the true class in ≥ 85 % and the exact orders in ≥ 80 % of ${fixture.cases.length} series`, () => {
    const all = totals(rows);
    expect(all.series).toBe(fixture.cases.length);
    expect(all.classRight / all.series).toBeGreaterThanOrEqual(0.85);
    expect(all.ordersRight / all.series).toBeGreaterThanOrEqual(0.8);
  });

  for (const group of groups) {
    it(`${group.process}, n = ${group.n}: right at least as often as auto.arima, class and orders`, () => {
      const row = rows.find((r) => r.process === group.process && r.n === group.n)!;
      expect(row.classRight).toBeGreaterThanOrEqual(row.autoArimaClassRight);
      expect(row.ordersRight).toBeGreaterThanOrEqual(row.autoArimaOrdersRight);
    });
  }
});
